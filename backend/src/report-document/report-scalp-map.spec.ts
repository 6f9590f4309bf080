import PDFDocument from 'pdfkit';
import { type RoiUsageView, scalpColourOf, scalpMapOf } from '@gyre/shared';
import { GYRE_COLORS } from '@gyre/shared/palette';
import { renderVisitReport } from './render-visit-report';
import { PAGE_SETUP, ReportCanvas } from './report-canvas';
import { ReportFonts } from './report-fonts';
import { drawScalpMaps, scalpMapPartOf } from './report-scalp-map';
import { readPdfText } from './testing/read-pdf-text';
import { sampleVisitReportModel } from './testing/sample-visit-report-model';
import type { ScalpMapChannels } from './visit-report-model';

// Hand-built per-channel values (the pipeline fills resting PAF/CoG per channel); the PDF is
// read back with pdf-parse (pdf.js) in a child process, and its drawing operators are read
// from the uncompressed content stream (PDF 32000-1:2008 §8.6.8: `c1 c2 c3 scn` in a DeviceRGB
// colour space sets the fill colour).

const USAGE: RoiUsageView = {
  wanted: ['O1', 'O2', 'Pz', 'POz'],
  used: ['EEG O1-REF', 'EEG Pz-REF'],
  leftOut: [
    { label: 'EEG O2-REF', reason: 'flat' },
    { label: 'POz', reason: 'missing' },
  ],
  status: 'partial',
};

const channel = (
  label: string,
  pafHz: number | null,
  cogHz: number | null,
  deltaFHz: number | null,
) => ({ label, canonical: null, pafHz, cogHz, deltaFHz });

const VALUES: ScalpMapChannels = {
  channels: [
    channel('EEG O1-REF', 9.8, 9.9, -0.36),
    channel('EEG O2-REF', null, null, null),
    channel('EEG T3-REF', 10.2, 10.05, 0.1),
    channel('EEG Fz-REF', null, null, 0.05),
    channel('EEG Pz-REF', 10.0, 10.0, -0.22),
    channel('EEG X5-REF', 9.5, 9.5, 0.2),
  ],
  flatChannels: ['EEG O2-REF'],
  saturatedChannels: [],
};

function squash(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/** The fill-colour operator pdfkit writes for a hex colour: components / 255, then `scn`. */
function fillOperator(hex: string): string {
  const parts = [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16) / 255);
  return `\n${parts.join(' ')} scn\n`;
}

/** A one-page PDF, uncompressed so its drawing operators can be read. */
async function drawnPdf(draw: (canvas: ReportCanvas) => void): Promise<Buffer> {
  const doc = new PDFDocument({ ...PAGE_SETUP, compress: false });
  const fonts = ReportFonts.load();
  fonts.registerWith(doc);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
  });
  draw(new ReportCanvas(doc, fonts));
  doc.end();
  return done;
}

async function drawnStream(draw: (canvas: ReportCanvas) => void): Promise<string> {
  return (await drawnPdf(draw)).toString('latin1');
}

describe('scalp maps in the visit report', () => {
  it('prints each map with its colour-bar labels, unit and the channels it could not colour', async () => {
    const base = sampleVisitReportModel();
    const model = {
      ...base,
      rest: { ...base.rest!, roiUsage: USAGE, scalpMap: VALUES },
      task: { ...base.task!, roiUsage: USAGE, scalpMap: VALUES },
    };
    const text = squash((await readPdfText(await renderVisitReport(model))).text);
    expect(text).toContain('Peak alpha frequency (PAF)');
    expect(text).toContain('Centre of gravity (CoG)');
    expect(text).toContain('Δf (post − baseline)');
    // PAF 9.8–10.2 Hz: d3 nice ticks every 0.1 Hz (d3-array ticks), bare numbers, unit beside.
    expect(text).toMatch(/9\.8 9\.9 10\.0 10\.1 10\.2 Hz/);
    // Δf: symmetric around 0 with the true minus (U+2212) and + (number-format).
    expect(text).toMatch(/\u22120\.4 \u22120\.2 0\.0 \+0\.2 \+0\.4 Hz/);
    expect(text).toContain('Left out: O2 (flat)');
    expect(text).toContain('Asked for, not in the file: POz');
    expect(text).toContain('No value: Fz');
    expect(text).toMatch(/No 10-10 position, not drawn: EEG X5- ?REF/); // may wrap at the hyphen
    expect(text).toContain('Oostenveld & Praamstra 2001');
    expect(text).toContain('Rest: scalp maps');
    expect(text).toContain('Task: scalp map');
  });

  it('leaves the map out of reports whose channels have no value to map', async () => {
    const text = squash(
      (await readPdfText(await renderVisitReport(sampleVisitReportModel()))).text,
    );
    expect(text).not.toContain('Scalp maps:');
  });

  it('fills each coloured channel with its value’s colour, and grey where there is no value', async () => {
    const map = scalpMapOf({ channels: VALUES.channels, roiUsage: USAGE, quality: VALUES }, 'paf');
    const stream = await drawnStream((canvas) => drawScalpMaps(canvas, 'Rest: scalp maps', [map]));
    // O1 at 9.8 Hz is the scale's low end: the first sequential stop, Gyre's primary teal.
    expect(stream).toContain(fillOperator(GYRE_COLORS.primary));
    // Pz at 10.0 Hz, the middle of 9.8–10.2: computed by d3-scale, written by pdfkit.
    expect(stream).toContain(fillOperator(scalpColourOf(10, map.scale!)));
    // T7 (the file's T3) at the top end: the last stop, the amber.
    expect(stream).toContain(fillOperator(GYRE_COLORS.amber));
    // No value (Fz): the line grey.
    expect(stream).toContain(fillOperator(GYRE_COLORS.line));
    // Colour bar: a shading of its own (PDF §8.7.4.5, axial shading type 2).
    expect(stream).toMatch(/\/ShadingType 2/);
  });
});

describe('channel names on the report’s scalp map', () => {
  // The 19 electrodes of the 10-20 system in their 10-10 names (ACNS 2016, from memory), each
  // with a value, so no name is also printed in the marks key below the map.
  const TEN_TWENTY = 'Fp1 Fp2 F7 F3 Fz F4 F8 T7 C3 Cz C4 T8 P7 P3 Pz P4 P8 O1 O2'.split(' ');
  const values: ScalpMapChannels = {
    channels: TEN_TWENTY.map((name, i) => channel(name, 9 + i / 10, 9 + i / 10, null)),
    flatChannels: [],
    saturatedChannels: [],
  };
  const usage: RoiUsageView = { wanted: [], used: TEN_TWENTY, leftOut: [], status: 'complete' };
  const map = scalpMapOf({ channels: values.channels, roiUsage: usage, quality: values }, 'paf');
  const draw = (canvas: ReportCanvas) => drawScalpMaps(canvas, 'Rest: scalp maps', [map]);

  it('prints every channel’s name beside its dot', async () => {
    const words = (await readPdfText(await drawnPdf(draw))).text.split(/\s+/);
    for (const name of TEN_TWENTY) expect(words).toContain(name);
  });

  it('sets the names at 6.5 pt, one text object each (PDF 32000-1:2008 §9.3.1: `font size Tf`)', async () => {
    const stream = await drawnStream(draw);
    expect(stream.match(/ 6\.5 Tf\n/g)).toHaveLength(TEN_TWENTY.length);
  });
});

describe('scalpMapPartOf', () => {
  const results = (channels: ScalpMapChannels['channels']) => ({
    channels,
    run: { roiUsage: USAGE },
    quality: { flatChannels: [], saturatedChannels: [] },
  });

  it('adds no key when no channel has a value (a report of an earlier run stays as it was)', () => {
    expect(
      scalpMapPartOf(results([channel('EEG O1-REF', null, null, null)]), ['paf', 'cog']),
    ).toEqual({});
    // A Δf but no PAF/CoG: still nothing for the rest maps.
    expect(scalpMapPartOf(results([channel('O1', null, null, -0.2)]), ['paf', 'cog'])).toEqual({});
  });

  it('keeps each channel’s names and values and the flat/saturated lists', () => {
    const part = scalpMapPartOf(results([channel('EEG O1-REF', 9.9, null, null)]), ['paf', 'cog']);
    expect(part.scalpMap).toEqual({
      channels: [{ label: 'EEG O1-REF', canonical: null, pafHz: 9.9, cogHz: null, deltaFHz: null }],
      flatChannels: [],
      saturatedChannels: [],
    });
  });
});

import { createHash } from 'node:crypto';
import { renderVisitReport } from './render-visit-report';
import { ReportRenderer } from './report-renderer';
import { ReportModelError } from './validate-report-model';
import { RESEARCH_CAUTION, SIGNATURE_MEANING } from './report-wording';
import { readPdfText } from './testing/read-pdf-text';
import { sampleVisitReportModel } from './testing/sample-visit-report-model';
import { VisitReportModel } from './visit-report-model';

// The model is generated (sampleVisitReportModel); every PDF is read back with pdf-parse 2
// (pdf.js) in a separate process, so the checks are on what a reader of the file sees.

/** pdf.js returns wrapped lines: compare text with all runs of white space made one space. */
function squash(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/** The expected printing of a signed number, written out here rather than imported. */
function signed(value: number, decimals: number): string {
  const digits = Math.abs(value).toFixed(decimals);
  return value < 0 ? `\u2212${digits}` : `+${digits}`;
}

const signature = {
  signerName: 'Dana Analyst',
  signedAtIso: '2026-12-01T22:40:05.000Z',
  meaning: SIGNATURE_MEANING,
};

describe('renderVisitReport', () => {
  let draftModel: VisitReportModel;
  let draftPdf: Buffer;
  let draftPages: string[];
  let signedPdf: Buffer;
  let signedPages: string[];

  beforeAll(async () => {
    draftModel = sampleVisitReportModel();
    draftPdf = await renderVisitReport(draftModel);
    draftPages = (await readPdfText(draftPdf)).pages.map(squash);
    signedPdf = await renderVisitReport(
      sampleVisitReportModel({
        signature,
        revision: 2,
        supersedes: { revision: 1, sha256: 'c0ffee'.padEnd(64, '0') },
      }),
    );
    signedPages = (await readPdfText(signedPdf)).pages.map(squash);
  });

  it('writes a PDF file (ISO 32000: the file starts with %PDF- and ends with %%EOF)', () => {
    expect(draftPdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(draftPdf.subarray(-6).toString('latin1')).toContain('%%EOF');
    expect(draftPages.length).toBeGreaterThanOrEqual(2);
  });

  it('prints the identification of the visit', () => {
    const text = draftPages.join(' ');
    expect(text).toContain('Synthetic Ageing Cohort (SAC)');
    expect(text).toContain('North Clinic (synthetic)');
    expect(text).toContain('Participant P-0042');
    expect(text).toContain('Visit Month 6');
    expect(text).toContain('Visit date 2026-11-20');
  });

  it('prints the rest and task numbers of the model, rounded as stated', () => {
    const text = draftPages.join(' ');
    const rest = draftModel.rest!;
    const task = draftModel.task!;
    // PAF and CoG to 0.01 Hz (10.213 → 10.21, 10.087 → 10.09).
    expect(text).toContain(`Peak alpha frequency (PAF) ${rest.pafHz!.toFixed(2)} Hz`);
    expect(text).toContain(`Centre of gravity (CoG) ${rest.cogHz!.toFixed(2)} Hz`);
    // Δf and its CI to 0.001 Hz with the typographic minus; p to 0.001.
    expect(text).toContain(`Δf (post − baseline) ${signed(task.deltaFHz!, 3)} Hz`);
    expect(text).toContain(
      `95 % CI of mean Δf ${signed(task.ciHz![0], 3)} to ${signed(task.ciHz![1], 3)} Hz`,
    );
    expect(text).toContain(`Wilcoxon signed-rank p ${task.pValue!.toFixed(3)}`);
    expect(text).toContain(`Trials ${task.trialsKept} of ${task.trialsTotal} kept`);
  });

  it('labels both plots with their quantities and units', () => {
    const text = draftPages.join(' ');
    expect(text).toContain('Frequency (Hz)');
    // pdf.js reads U+00B5 (micro) back as U+03BC (Greek mu).
    expect(text).toMatch(/Power spectral density \([µμ]V²\/Hz, log scale\)/);
    expect(text).toContain('Time from stimulus onset (s)');
    expect(text).toContain('Instantaneous frequency (Hz)');
  });

  it('draws the plots as vector paths, not images', () => {
    // An embedded raster would be an image XObject (ISO 32000-1 §8.9.5: /Subtype /Image).
    expect(draftPdf.includes('/Subtype /Image')).toBe(false);
  });

  it('embeds the shipped IBM Plex faces (no standard-14 font stands in)', () => {
    const raw = draftPdf.toString('latin1');
    expect(raw).toMatch(/\/BaseFont \/[A-Z]{6}\+IBMPlexSans/);
    expect(raw).toMatch(/\/BaseFont \/[A-Z]{6}\+IBMPlexMono/);
    expect(raw).not.toMatch(/\/BaseFont \/Helvetica/);
  });

  it('puts the caution, the state and "Page n of N" on every page', () => {
    for (const pages of [draftPages, signedPages]) {
      pages.forEach((page, index) => {
        expect(page).toContain(RESEARCH_CAUTION);
        expect(page).toContain(`Page ${index + 1} of ${pages.length}`);
      });
    }
    for (const page of draftPages) expect(page).toContain('DRAFT · NOT SIGNED');
    for (const page of signedPages) expect(page).toContain('SIGNED · REVISION 2');
  });

  it('prints the quality checks in words and the flag with its reason', () => {
    const text = draftPages.join(' ');
    expect(text).toContain('Duration 300.0 s, sampled at 256 Hz.');
    expect(text).toContain('Flat channels (almost no signal): T7.');
    expect(text).toContain('Phase slips: 2.1 % of the raw instantaneous-frequency values');
    expect(text).toContain('Epochs dropped: 5.0 % of the stimulus onsets.');
    expect(text).toContain('Flag raised');
    expect(text).toContain(draftModel.flags[0].raiseReason);
  });

  it('prints settings version, code version and input checksums', () => {
    const text = draftPages.join(' ');
    for (const entry of draftModel.provenance) {
      expect(text).toContain(`Input SHA-256 ${entry.inputChecksumSha256}`);
      expect(text).toContain(`Code version ${entry.codeVersion}`);
      expect(text).toContain(`Analysis run ${entry.analysisRunId}`);
    }
    expect(text).toContain('Settings version 3');
  });

  it('prints the signer, the UTC date and time and the meaning when signed (§11.50)', () => {
    const text = signedPages.join(' ');
    expect(text).toContain('Signed by Dana Analyst');
    expect(text).toContain('Date and time 2026-12-01 22:40:05 UTC');
    expect(text).toContain(`Meaning ${SIGNATURE_MEANING}`);
    expect(text).toContain('Replaces signed revision 1');
    expect(text).toContain(`Its SHA-256 ${'c0ffee'.padEnd(64, '0')}`);
    expect(text).not.toContain('DRAFT');
  });

  it('says a draft is not signed and prints no signer', () => {
    const text = draftPages.join(' ');
    expect(text).toContain('Not signed.');
    expect(text).not.toContain('Signed by');
  });

  it('gives the same bytes for the same model (so a stored hash can be checked again)', async () => {
    const again = await renderVisitReport(sampleVisitReportModel());
    const hash = (b: Buffer) => createHash('sha256').update(b).digest('hex');
    expect(hash(again)).toBe(hash(draftPdf));
  });

  it('renders the same bytes on the worker thread as on the caller', async () => {
    const renderer = new ReportRenderer();
    try {
      const fromWorker = await renderer.render(sampleVisitReportModel());
      expect(Buffer.compare(fromWorker, draftPdf)).toBe(0);
    } finally {
      await renderer.close();
    }
  });

  it('sets Greek and Latin Extended text from the shipped subsets', async () => {
    const model = sampleVisitReportModel({
      site: { name: 'Łódź Ośrodek' },
      flags: [{ ...sampleVisitReportModel().flags[0], raiseReason: 'Δf < 0 in Ωz-free ROI' }],
    });
    const text = squash((await readPdfText(await renderVisitReport(model))).text);
    expect(text).toContain('Site Łódź Ośrodek');
    expect(text).toContain('Reason Δf < 0 in Ωz-free ROI');
  });

  it('says "no clear peak" with the reason instead of forcing a PAF (METHOD.md §4)', async () => {
    const base = sampleVisitReportModel();
    const model = sampleVisitReportModel({
      rest: { ...base.rest!, pafHz: null, prominenceDb: null, noPeakReason: 'below-prominence' },
    });
    const text = squash((await readPdfText(await renderVisitReport(model))).text);
    expect(text).toContain(
      'Peak alpha frequency (PAF) no clear peak: the highest alpha peak does not stand out',
    );
  });

  it('says so when the visit has no task or rest result', async () => {
    const model = sampleVisitReportModel({ rest: null, task: null, flagSuggestion: null });
    const text = squash((await readPdfText(await renderVisitReport(model))).text);
    expect(text).toContain('No resting result for this visit.');
    expect(text).toContain('No task result for this visit.');
  });

  it('refuses a model whose series disagree, naming the field', async () => {
    const base = sampleVisitReportModel();
    const model = sampleVisitReportModel({
      rest: {
        ...base.rest!,
        spectrum: { frequencyHz: [1, 2, 3], powerUv2PerHz: [1, 2] },
      },
    });
    await expect(renderVisitReport(model)).rejects.toThrow(ReportModelError);
    await expect(renderVisitReport(model)).rejects.toThrow(
      'Report field rest.spectrum.powerUv2PerHz: found 2 values, expected 3',
    );
  });

  it('refuses a non-finite headline number and a bad visit date', async () => {
    const base = sampleVisitReportModel();
    await expect(
      renderVisitReport(sampleVisitReportModel({ task: { ...base.task!, deltaFHz: Number.NaN } })),
    ).rejects.toThrow('Report field task.deltaFHz: found NaN, expected a finite number or null.');
    await expect(
      renderVisitReport(sampleVisitReportModel({ visit: { label: 'V1', date: '20/11/2026' } })),
    ).rejects.toThrow('Report field visit.date: found "20/11/2026", expected YYYY-MM-DD.');
  });
});

import { createHash } from 'node:crypto';
import { renderVisitReport } from './render-visit-report';
import { ReportRenderer } from './report-renderer';
import { ReportModelError } from './validate-report-model';
import { RESEARCH_CAUTION, SIGNATURE_MEANING } from './report-wording';
import { readPdfText } from './testing/read-pdf-text';
import {
  SAMPLE_NO_ROI,
  SAMPLE_TASK_DEPTH,
  sampleVisitReportModel,
} from './testing/sample-visit-report-model';
import { RestSection, TaskSection, VisitReportModel } from './visit-report-model';

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

/** The generated model with `changes` made to its task section. */
function withTask(changes: Partial<TaskSection>): VisitReportModel {
  const base = sampleVisitReportModel();
  return sampleVisitReportModel({ task: { ...base.task!, ...changes } });
}

/** The text of one section: from its heading up to the next section's heading. */
function section(text: string, heading: string, nextHeading: string): string {
  const start = text.indexOf(heading);
  const end = text.indexOf(nextHeading, start);
  if (start < 0 || end < 0) throw new Error(`No section "${heading}" … "${nextHeading}".`);
  return text.slice(start, end);
}

const TASK_HEADING = 'Task: alpha frequency around stimulus onset';
const REST_HEADING = 'Rest: individual alpha frequency';

/** The sample's task section with no region-of-interest channel left. */
function noRoiTask(): TaskSection {
  return {
    ...sampleVisitReportModel().task!,
    deltaFHz: null,
    ciHz: null,
    pValue: null,
    onsetCurve: { timeS: [], meanHz: [], ciLowHz: [], ciHighHz: [] },
    roiUsage: SAMPLE_NO_ROI,
  };
}

/** The sample's rest section with no region-of-interest channel left. */
function noRoiRest(): RestSection {
  return {
    ...sampleVisitReportModel().rest!,
    pafHz: null,
    cogHz: null,
    prominenceDb: null,
    spectrum: { frequencyHz: [], powerUv2PerHz: [] },
    roiUsage: SAMPLE_NO_ROI,
  };
}

async function renderText(model: VisitReportModel): Promise<string> {
  return squash((await readPdfText(await renderVisitReport(model))).text);
}

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
    // Δf and its CI to 0.01 Hz with the typographic minus, as on screen; p to 0.001.
    expect(text).toContain(`Δf (post − baseline) ${signed(task.deltaFHz!, 2)} Hz`);
    expect(text).toContain(
      `95 % CI of mean Δf ${signed(task.ciHz![0], 2)} to ${signed(task.ciHz![1], 2)} Hz`,
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

  it('says "no clear peak" with the reason instead of forcing a PAF (docs/method.md §4)', async () => {
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
    await expect(renderVisitReport(withTask({ deltaFHz: Number.NaN }))).rejects.toThrow(
      'Report field task.deltaFHz: found NaN, expected a finite number or null.',
    );
    await expect(
      renderVisitReport(sampleVisitReportModel({ visit: { label: 'V1', date: '20/11/2026' } })),
    ).rejects.toThrow('Report field visit.date: found "20/11/2026", expected YYYY-MM-DD.');
  });
  it('names the region-of-interest channels each result rests on, and why some were left out', () => {
    const text = draftPages.join(' ');
    expect(section(text, REST_HEADING, TASK_HEADING)).toContain(
      'Region of interest: O1, O2, Oz, Pz (all 4 wanted).',
    );
    expect(section(text, TASK_HEADING, 'Quality checks')).toContain(
      'Region of interest: O1, O2, Pz (3 of 5 wanted). Left out: Oz — saturated (runs at the ' +
        "converter's limit); POz — not in the file.",
    );
  });

  it('marks a headline number that rests on part of the region of interest on its own row', async () => {
    const draft = draftPages.join(' ');
    expect(section(draft, TASK_HEADING, 'Quality checks')).toContain(
      'Δf (post − baseline) \u22120.29 Hz (negative = slowing); from 3 of 5 region-of-interest ' +
        'channels',
    );
    expect(section(draft, REST_HEADING, TASK_HEADING)).not.toContain('region-of-interest channels');
    const base = sampleVisitReportModel();
    const text = await renderText(
      sampleVisitReportModel({ rest: { ...base.rest!, roiUsage: base.task!.roiUsage } }),
    );
    expect(section(text, REST_HEADING, TASK_HEADING)).toContain(
      'Peak alpha frequency (PAF) 10.21 Hz; from 3 of 5 region-of-interest channels',
    );
  });

  it('prints the recording the numbers come from, and the one it replaced with the reason', () => {
    const text = draftPages.join(' ');
    expect(section(text, REST_HEADING, TASK_HEADING)).toContain(
      'Numbers from recording 7a3e9c10, uploaded 2026-11-20 09:14:02 UTC.',
    );
    expect(section(text, REST_HEADING, TASK_HEADING)).not.toContain('replaces recording');
    expect(section(text, TASK_HEADING, 'Quality checks')).toContain(
      'Numbers from recording e41b07d2, uploaded 2026-11-20 10:02:47 UTC; replaces recording ' +
        '5c2f8a61: Wrong onset file attached to the first upload.',
    );
  });

  it('says "no reason recorded" when a replacement came without one', async () => {
    const { source } = sampleVisitReportModel().task!;
    const text = await renderText(withTask({ source: { ...source, replacementReason: '  ' } }));
    expect(text).toContain('replaces recording 5c2f8a61 (no reason recorded).');
  });

  it('says beside the flag suggestion how many channels it rests on when some were left out', () => {
    const text = section(draftPages.join(' '), 'Slowing flag', 'Provenance');
    expect(text).toContain('The computation suggests a slowing flag');
    expect(text).toContain('It rests on 3 of 5 region-of-interest channels (see Task).');
  });

  /** A section without region-of-interest channels: each channel's reason, its recording, no numbers. */
  function expectNoRoiSection(section: string, measure: string, recording: string): void {
    expect(section).toContain(
      'No region-of-interest channel remains: O1 — flat; O2 — saturated (runs at the ' +
        "converter's limit); Oz — another sampling rate; Pz — left out by this visit's " +
        `setting; POz — not in the file. No ${measure} is reported.`,
    );
    expect(section).toContain(recording);
    expect(section).not.toContain('Numbers from');
  }

  it('prints no Δf, no plot and the reasons when no task ROI channel remains', async () => {
    // Stored as false by a caller that coerced "no suggestion": must not read as "no slowing".
    const model = sampleVisitReportModel({
      task: noRoiTask(),
      flagSuggestion: { suggestsSlowing: false, flagThresholdHz: -0.2 },
    });
    const text = await renderText(model);
    const task = section(text, TASK_HEADING, 'Quality checks');
    expectNoRoiSection(
      task,
      'Δf',
      'Analysed recording e41b07d2, uploaded 2026-11-20 10:02:47 UTC;',
    );
    expect(task).not.toMatch(/\d\.\d{3} Hz/);
    expect(task).not.toContain('Δf (post − baseline)');
    expect(task).not.toContain('Wilcoxon');
    expect(text).not.toContain('Time from stimulus onset (s)');
    expect(text).not.toContain('No task result');
    const flag = section(text, 'Slowing flag', 'Provenance');
    expect(flag).toContain('No suggestion: no region-of-interest channel remains');
    expect(flag).not.toContain('does not suggest');
  });

  it('says "No suggestion" for a task without ROI channels even when no suggestion was stored', async () => {
    const text = await renderText(
      sampleVisitReportModel({ task: noRoiTask(), flagSuggestion: null }),
    );
    expect(section(text, 'Slowing flag', 'Provenance')).toContain(
      'No suggestion: no region-of-interest channel remains.',
    );
  });

  it('prints no PAF, no CoG, no spectrum and the reasons when no rest ROI channel remains', async () => {
    const text = await renderText(sampleVisitReportModel({ rest: noRoiRest() }));
    const rest = section(text, REST_HEADING, TASK_HEADING);
    expectNoRoiSection(
      rest,
      'PAF or CoG',
      'Analysed recording 7a3e9c10, uploaded 2026-11-20 09:14:02 UTC.',
    );
    expect(rest).not.toMatch(/\d\.\d{2} Hz/);
    expect(rest).not.toContain('Peak alpha frequency (PAF)');
    expect(text).not.toContain('Power spectral density');
    expect(text).not.toContain('No resting result');
  });

  it('says "No suggestion" when the computation gave none for a task with channels', async () => {
    const text = await renderText(
      sampleVisitReportModel({ flagSuggestion: { suggestsSlowing: null, flagThresholdHz: -0.2 } }),
    );
    const flag = section(text, 'Slowing flag', 'Provenance');
    expect(flag).toContain('No suggestion: the computation gave no Δf to apply the rule to');
    expect(flag).not.toContain('suggests a slowing flag');
  });

  it('prints a Δf that rounds to zero without a sign, and never a hyphen for minus', async () => {
    const text = await renderText(withTask({ deltaFHz: -0.0004, ciHz: [-0.0003, 0.2] }));
    expect(text).toContain('Δf (post − baseline) 0.00 Hz (negative = slowing)');
    expect(text).toContain('95 % CI of mean Δf 0.00 to +0.20 Hz');
    expect(text).not.toContain('\u22120.00');
    expect(text).not.toContain('+0.00');
    expect(draftPages.join(' ')).not.toMatch(/(^|[\s(])-\d/);
  });

  it('refuses a number beside a region of interest with no channel left', async () => {
    const task = { ...noRoiTask(), deltaFHz: -0.3 };
    await expect(renderVisitReport(sampleVisitReportModel({ task }))).rejects.toThrow(
      'Report field task.deltaFHz: found -0.3, expected null when no region-of-interest ' +
        'channel remains.',
    );
    const rest = { ...noRoiRest(), pafHz: 10.1 };
    await expect(renderVisitReport(sampleVisitReportModel({ rest }))).rejects.toThrow(
      'Report field rest.pafHz: found 10.1, expected null when no region-of-interest channel ' +
        'remains.',
    );
    await expect(
      renderVisitReport(
        sampleVisitReportModel({
          task: noRoiTask(),
          flagSuggestion: { suggestsSlowing: true, flagThresholdHz: -0.2 },
        }),
      ),
    ).rejects.toThrow('Report field flagSuggestion.suggestsSlowing: found true');
  });

  it('refuses region-of-interest usage whose status or counts disagree with its lists', async () => {
    const withUsage = (roiUsage: TaskSection['roiUsage']) =>
      renderVisitReport(withTask({ roiUsage }));
    const partial = sampleVisitReportModel().task!.roiUsage;
    await expect(withUsage({ ...partial, status: 'complete' })).rejects.toThrow(
      'Report field task.roiUsage.status: found "complete", expected "partial" for 3 used and 2 ' +
        'left out.',
    );
    await expect(withUsage({ ...partial, wanted: ['O1', 'O2', 'Pz'] })).rejects.toThrow(
      'Report field task.roiUsage: found 3 used and 2 left out, expected together the 3 wanted ' +
        'channels.',
    );
    await expect(
      withUsage({
        ...partial,
        leftOut: [{ label: 'Oz', reason: 'unplugged' as 'flat' }, partial.leftOut[1]],
      }),
    ).rejects.toThrow('Report field task.roiUsage.leftOut[0].reason: found "unplugged"');
  });

  it('keeps the Task heading on the page of its chart, however far down the section starts', async () => {
    // The section starts lower as the rest section's ROI note grows; one of these lengths
    // left the heading at the foot of page 1 and the chart on page 2 (issue 15).
    const base = sampleVisitReportModel();
    for (const extraChannels of [0, 6, 12, 18, 24, 30, 36]) {
      const leftOut = [
        ...base.rest!.roiUsage.leftOut,
        ...Array.from({ length: extraChannels }, (_, i) => ({
          label: `X${i + 1}`,
          reason: 'flat' as const,
        })),
      ];
      const roiUsage = {
        ...base.rest!.roiUsage,
        wanted: [...base.rest!.roiUsage.used, ...leftOut.map((c) => c.label)],
        leftOut,
        status: leftOut.length === 0 ? ('complete' as const) : ('partial' as const),
      };
      const pdf = await renderVisitReport(
        sampleVisitReportModel({ rest: { ...base.rest!, roiUsage } }),
      );
      const pages = (await readPdfText(pdf)).pages.map(squash);
      const headingPage = pages.findIndex((p) => p.includes(TASK_HEADING));
      // The onset curve's axis title and legend are drawn with the chart.
      const chartPage = pages.findIndex((p) => p.includes('Time from stimulus onset (s)'));
      expect({ extraChannels, headingPage }).toEqual({ extraChannels, headingPage: chartPage });
      expect(pages[chartPage]).toContain('95 % CI (bootstrap)');
    }
  });

  it('refuses a replacement reason without the recording it replaced', async () => {
    const base = sampleVisitReportModel();
    const source = { ...base.rest!.source, replacesId: null, replacementReason: 'Noisy' };
    await expect(
      renderVisitReport(sampleVisitReportModel({ rest: { ...base.rest!, source } })),
    ).rejects.toThrow(
      'Report field rest.source.replacementReason: found "Noisy", expected null when no ' +
        'recording is replaced.',
    );
  });

  describe('conditions, the cycle-by-cycle cross-check and the amplitude gate', () => {
    const DEPTH_HEADING = 'Task: conditions and cross-checks';
    let text: string;
    beforeAll(async () => {
      text = await renderText(withTask({ depth: SAMPLE_TASK_DEPTH }));
    });

    it('gives Δf, CI, Wilcoxon p and trials per condition, rounded as on screen', () => {
      const depth = section(text, DEPTH_HEADING, 'Quality checks');
      // −0.4123 → −0.41, CI −0.5832 → −0.58, −0.2411 → −0.24; p 0.00021 → < 0.001.
      expect(depth).toContain(
        'Tone Δf −0.41 Hz; 95 % CI −0.58 to −0.24 Hz; Wilcoxon p < 0.001; 19 of 20 trials kept',
      );
      expect(depth).toContain(
        'Word Δf −0.16 Hz; 95 % CI −0.32 to 0.00 Hz; Wilcoxon p 0.047; 19 of 20 trials kept',
      );
    });

    it('labels the difference as one, with its CI and permutation p, and says how the pair was chosen', () => {
      const depth = section(text, DEPTH_HEADING, 'Quality checks');
      expect(depth).toContain(
        'Difference Tone − Word −0.25 Hz; 95 % CI −0.48 to −0.02 Hz; permutation p 0.031',
      );
      expect(depth).toContain("the pair named in the study's analysis settings");
      expect(depth).toContain('permutation test with 5000 label shuffles (seed 20190815)');
    });

    it('prints the cycle-by-cycle Δf beside the phase-based one, with the disagreement warning', () => {
      const depth = section(text, DEPTH_HEADING, 'Quality checks');
      expect(depth).toContain('Δf, phase-based −0.29 Hz');
      expect(depth).toContain('Δf, cycle-by-cycle −0.14 Hz; 95 % CI −0.29 to +0.01 Hz');
      expect(depth).toContain('35 of 38 trials with burst cycles in both windows');
      // |−0.1402 − (−0.2871)| = 0.1469 → 0.15 Hz, above the 0.10 Hz threshold.
      expect(depth).toContain(
        'Warning: the cycle-by-cycle and the phase-based Δf differ by 0.15 Hz, more than the ' +
          'threshold of 0.10 Hz in the settings the run was computed with.',
      );
    });

    it("gives the gate's percentile and the share of the region's samples it left out", () => {
      // 46 080 of 184 320 samples = 25.0 %.
      expect(section(text, DEPTH_HEADING, 'Quality checks')).toContain(
        "Amplitude gate samples under percentile 25 of each channel's envelope; 25.0 % of the " +
          "region's samples left out",
      );
    });

    it('prints no warning when the estimates agree, and no section for a run without these', async () => {
      const agreeing = await renderText(
        withTask({
          depth: {
            ...SAMPLE_TASK_DEPTH,
            cycles: { ...SAMPLE_TASK_DEPTH.cycles!, disagreementHz: 0.05, disagrees: false },
          },
        }),
      );
      expect(agreeing).toContain('Δf, cycle-by-cycle');
      expect(agreeing).not.toContain('Warning: the cycle-by-cycle');
      expect(draftPages.join(' ')).not.toContain(DEPTH_HEADING);
    });
  });

  it('lists the analysis-depth settings in the provenance of each run', async () => {
    const base = sampleVisitReportModel();
    const provenance = base.provenance.map((entry) => ({
      ...entry,
      depthSettings: {
        amplitudeGatePercentile: 25,
        cycleDisagreementHz: 0.15,
        compareConditions: ['Tone', 'Word'] as [string, string],
      },
    }));
    const text = section(
      await renderText(sampleVisitReportModel({ provenance })),
      'Provenance',
      'Electronic signature',
    );
    expect(text).toContain('Amplitude gate percentile 25 of the envelope');
    expect(text).toContain('Cross-check threshold 0.15 Hz');
    expect(text).toContain('Conditions compared “Tone” − “Word”');
    expect(section(draftPages.join(' '), 'Provenance', 'Electronic signature')).toContain(
      'Amplitude gate off Cross-check threshold 0.10 Hz Conditions compared the first two found',
    );
  });

  it('refuses a gate percentile outside 1–90 and a non-finite condition Δf, naming the field', async () => {
    const withDepth = (depth: typeof SAMPLE_TASK_DEPTH) => renderVisitReport(withTask({ depth }));
    await expect(
      withDepth({
        ...SAMPLE_TASK_DEPTH,
        amplitudeGate: { ...SAMPLE_TASK_DEPTH.amplitudeGate!, percentile: 95 },
      }),
    ).rejects.toThrow(
      'Report field task.depth.amplitudeGate.percentile: found 95, expected null (off) or a ' +
        'percentile from 1 to 90.',
    );
    await expect(
      withDepth({
        ...SAMPLE_TASK_DEPTH,
        conditions: [{ ...SAMPLE_TASK_DEPTH.conditions[0], deltaFHz: Number.POSITIVE_INFINITY }],
      }),
    ).rejects.toThrow(
      'Report field task.depth.conditions[0].deltaFHz: found Infinity, expected a finite number or null.',
    );
  });
});

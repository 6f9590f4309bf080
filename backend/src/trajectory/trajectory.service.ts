import { Injectable } from '@nestjs/common';
import type { TrajectoryView, TrajectoryVisitView, TrendView } from '@gyre/shared';
import { AnalysisRunsService, type RunNumbers } from '../analysis/analysis-runs.service';
import type { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { TrajectoryError, trajectoryError } from './trajectory.errors';
import { TrajectoryInputs } from './trajectory-inputs';
import { trendOf } from './trend-rule';

type Metric = 'pafHz' | 'cogHz' | 'deltaFHz';

/**
 * A participant's course over visits (docs/method.md §5): PAF and CoG of the current resting
 * numbers and Δf of the current task numbers per visit (never a superseded recording's),
 * change from the first visit with a value, Theil–Sen slope in Hz per year over visit dates
 * where the study's trend rule allows one (trend-rule.ts), and the visits an analyst flagged.
 */
@Injectable()
export class TrajectoryService {
  constructor(
    private readonly runs: AnalysisRunsService,
    // Participant, visits, flags and trend rule by prepared statements (a hot route).
    private readonly inputs: TrajectoryInputs,
    private readonly blinding: BlindingService,
  ) {}

  async forParticipant(caller: Caller, participantId: string): Promise<TrajectoryView> {
    const participant = this.inputs.participantInScope(caller, participantId);
    if (participant === null) {
      throw trajectoryError(
        TrajectoryError.ParticipantNotFound,
        `No participant ${participantId}.`,
        { participantId },
      );
    }
    // Blinded review: an analyst's course holds only the visits they recorded their decision on.
    const unblinded = await this.blinding.unblindedVisitIds(caller);
    const shown = unblinded === null ? null : new Set(unblinded);
    const visits = this.inputs.visitsOf(participantId).filter((v) => shown?.has(v.id) ?? true);
    const visitIds = visits.map((v) => v.id);
    // Headline columns only: whole rows would carry every run's packed curves.
    const runs = await this.runs.currentRunNumbersOfVisits(visitIds);
    const flagged = this.inputs.raisedFlagVisitIds(visitIds);

    const rows = visits.map((visit) => {
      const rest = runs.find((r) => r.visitId === visit.id && r.kind === 'resting');
      const task = runs.find((r) => r.visitId === visit.id && r.kind === 'task');
      return {
        visit,
        pafHz: rest?.pafHz ?? null,
        cogHz: rest?.cogHz ?? null,
        deltaFHz: task?.roiDeltaFHz ?? null,
      };
    });
    const first = (metric: Metric): number | null =>
      rows.find((r) => r[metric] !== null)?.[metric] ?? null;
    const baseline = { pafHz: first('pafHz'), cogHz: first('cogHz'), deltaFHz: first('deltaFHz') };
    const change = (metric: Metric, value: number | null): number | null =>
      value === null || baseline[metric] === null ? null : value - baseline[metric];
    const rule = this.inputs.trendRuleOf(participant.studyId);
    const trend = (metric: Metric): TrendView =>
      trendOf(
        rows.flatMap((r) => {
          const value = r[metric];
          return value === null ? [] : [{ date: r.visit.visitDate, value }];
        }),
        rule,
      );
    const trends = { paf: trend('pafHz'), cog: trend('cogHz'), deltaF: trend('deltaFHz') };
    const out: TrajectoryVisitView[] = rows.map((r) => ({
      visitId: r.visit.id,
      label: r.visit.label,
      date: r.visit.visitDate,
      pafHz: r.pafHz,
      cogHz: r.cogHz,
      deltaFHz: r.deltaFHz,
      pafChangeHz: change('pafHz', r.pafHz),
      cogChangeHz: change('cogHz', r.cogHz),
      deltaFChangeHz: change('deltaFHz', r.deltaFHz),
      flagged: flagged.has(r.visit.id),
      doubts: doubtsOf(runs.filter((run) => run.visitId === r.visit.id)),
    }));
    return {
      participantId,
      visits: out,
      trendRule: rule,
      trends,
      slopesHzPerYear: {
        paf: trends.paf.slopeHzPerYear,
        cog: trends.cog.slopeHzPerYear,
        deltaF: trends.deltaF.slopeHzPerYear,
      },
    };
  }
}

/** What makes a visit's numbers doubtful, as every surface that shows them must say. */
function doubtsOf(runs: readonly RunNumbers[]): string[] {
  const doubts: string[] = [];
  for (const run of runs) {
    const what = run.kind === 'task' ? 'Δf' : 'PAF and CoG';
    const usage = run.roiUsage;
    // A partial region is partial because of its doubtful channels; names a default region
    // lacks only count when nothing else explains it (then the study named them itself).
    const notMissing = usage.leftOut.filter((o) => o.reason !== 'missing');
    const doubtful = notMissing.length > 0 ? notMissing : usage.leftOut;
    if (usage.status === 'none') {
      doubts.push(`No ${what}: no region-of-interest channel remains.`);
    } else if (usage.status === 'partial') {
      const names = doubtful.map((o) => `${o.label} (${o.reason})`).join(', ');
      doubts.push(
        `${what} from ${usage.used.length} of ${usage.wanted.length} region-of-interest channels; left out: ${names}.`,
      );
    }
    if (run.kind === 'task' && run.bandSource === 'default') {
      doubts.push('Δf in the 8–13 Hz band: the visit has no resting IAF to follow.');
    }
  }
  return doubts;
}

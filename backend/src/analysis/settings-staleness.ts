import { Injectable } from '@nestjs/common';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import type { AnalysisSettings as SettingsValues } from '../signal/pipeline/analysis-settings';
import type { AnalysisRun } from './analysis-run.entity';
import { staleSettingsPhrases } from './settings-differences';
import { parseStoredSettings, withOverride } from './settings-values';
import {
  VisitAnalysisOverridesService,
  valuesOfOverrideJson,
} from './visit-analysis-overrides.service';

/** What the stale-settings notice needs of a run. */
export type StalenessInput = Pick<
  AnalysisRun,
  'id' | 'visitId' | 'studyId' | 'kind' | 'settingsJson'
>;

/** Pairs of (settings version, override revision) kept parsed; one per visit in use at most. */
const KEPT_EFFECTIVE = 1024;
/** Notices kept; one per (run settings, current settings) pair in use at most. */
const KEPT_PHRASES = 4096;

interface CurrentRows {
  settingsId: string | null;
  overrideId: string | null;
}

/**
 * The stale-settings notice of runs: what the visit's current settings (the study's newest
 * version with the visit's newest override) would compute differently, in words. The one
 * owner of its caches, which need no invalidation: every request reads which rows are
 * current (one prepared statement), and the caches are keyed by those rows' ids. Settings
 * versions and override revisions are only ever added, never changed, so a new version or
 * override is a new key and shows at the very next request, whoever wrote it.
 */
@Injectable()
export class SettingsStaleness {
  private readonly effective = new Map<string, SettingsValues>();
  private readonly phrases = new Map<string, string[]>();

  constructor(
    private readonly reads: SqliteReadsService,
    private readonly overrides: VisitAnalysisOverridesService,
  ) {}

  /** For each run (by id): the notice's phrases, empty when nothing would differ. */
  async forRuns(runs: readonly StalenessInput[]): Promise<Map<string, string[]>> {
    const out = new Map<string, string[]>();
    const byVisit = new Map<string, { key: string; settings: SettingsValues }>();
    for (const run of runs) {
      let current = byVisit.get(run.visitId);
      if (current === undefined) {
        current = await this.currentOf(run.studyId, run.visitId);
        byVisit.set(run.visitId, current);
      }
      // The run's own settings text is part of the key, so no assumption about run rows.
      const key = `${current.key}\n${run.kind}\n${run.settingsJson}`;
      let found = this.phrases.get(key);
      if (found === undefined) {
        found = staleSettingsPhrases(
          run.kind,
          parseStoredSettings(run.settingsJson),
          current.settings,
        );
        keep(this.phrases, key, found, KEPT_PHRASES);
      }
      // A copy: callers own what they are given.
      out.set(run.id, [...found]);
    }
    return out;
  }

  /** The visit's current settings and the ids that name them. */
  private async currentOf(
    studyId: string,
    visitId: string,
  ): Promise<{ key: string; settings: SettingsValues }> {
    let rows = this.currentRows(studyId, visitId);
    if (rows.settingsId === null) {
      // A study without a version yet: effectiveFor writes version 1 (Gyre's defaults).
      await this.overrides.effectiveFor(studyId, visitId);
      rows = this.currentRows(studyId, visitId);
    }
    const key = `${rows.settingsId ?? ''}\n${rows.overrideId ?? ''}`;
    let settings = this.effective.get(key);
    if (settings === undefined) {
      // Read by id in the same synchronous step: the parsed values are those of the key's rows.
      const version = this.reads.one<{ valuesJson: string }>(
        `SELECT "valuesJson" FROM "analysis_settings" WHERE "id" = ?`,
        [rows.settingsId],
      );
      const override =
        rows.overrideId === null
          ? null
          : this.reads.one<{ valuesJson: string }>(
              `SELECT "valuesJson" FROM "visit_analysis_override" WHERE "id" = ?`,
              [rows.overrideId],
            );
      if (version === null) throw new Error(`analysis settings ${rows.settingsId} vanished`);
      settings = withOverride(
        parseStoredSettings(version.valuesJson),
        override === null ? null : valuesOfOverrideJson(override.valuesJson),
      );
      keep(this.effective, key, settings, KEPT_EFFECTIVE);
    }
    return { key, settings };
  }

  private currentRows(studyId: string, visitId: string): CurrentRows {
    return (
      this.reads.one<CurrentRows>(
        `SELECT
          (SELECT "id" FROM "analysis_settings" WHERE "studyId" = ? ORDER BY "version" DESC LIMIT 1) AS "settingsId",
          (SELECT "id" FROM "visit_analysis_override" WHERE "visitId" = ? ORDER BY "revision" DESC LIMIT 1) AS "overrideId"`,
        [studyId, visitId],
      ) ?? { settingsId: null, overrideId: null }
    );
  }
}

/** Insertion-ordered: past the bound, the oldest entry goes. */
function keep<V>(map: Map<string, V>, key: string, value: V, bound: number): void {
  if (map.size >= bound) map.delete(map.keys().next().value as string);
  map.set(key, value);
}

import type { FuzzSummary } from './fuzz-runner';

const mb = (bytes: number): string => `${(bytes / 2 ** 20).toFixed(1)} MB`;
const ms = (value: number): string => `${value.toFixed(value < 10 ? 2 : 0)} ms`;

/** The summary as printed by `npm run fuzz` (and quoted in docs/reliability.md). */
export function formatSummary(summary: FuzzSummary, machine: string): string {
  const lines: string[] = [];
  const count = (record: Record<string, number>, key: string): number => record[key] ?? 0;
  lines.push(`Fuzzing the reader: seed ${summary.seed}, ${summary.cases} cases, ${machine}`);
  lines.push(
    `  outcomes: ${count(summary.outcomes, 'accepted')} accepted, ${count(summary.outcomes, 'rejected')} rejected with a field, ` +
      `${count(summary.outcomes, 'thrown-clear-error')} clear errors thrown, ${count(summary.outcomes, 'violation')} violations`,
  );
  for (const [target, outcomes] of Object.entries(summary.byTarget).sort()) {
    const parts = Object.entries(outcomes)
      .sort()
      .map(([k, n]) => `${k} ${n}`);
    lines.push(`    ${target}: ${parts.join(', ')}`);
  }
  lines.push(
    `  time per case: max ${ms(summary.timeMs.max)} (case ${summary.timeMs.slowestCase}), ` +
      `p99 ${ms(summary.timeMs.p99)}, median ${ms(summary.timeMs.p50)}, mean ${ms(summary.timeMs.mean)}; ` +
      `wall ${(summary.wallMs / 1000).toFixed(1)} s`,
  );
  lines.push(
    `  memory: max growth in one case ${mb(summary.memory.maxGrowthBytes)} (case ${summary.memory.maxGrowthCase}), ` +
      `peak RSS of the process ${mb(summary.memory.peakRssBytes)}`,
  );
  lines.push('  mutation families:');
  const families = Object.entries(summary.families).sort((a, b) => b[1] - a[1]);
  for (let i = 0; i < families.length; i += 4) {
    lines.push(
      `    ${families
        .slice(i, i + 4)
        .map(([f, n]) => `${f} ${n}`)
        .join(', ')}`,
    );
  }
  lines.push(`  most frequent rejection fields (of ${summary.rejectionFields.length}):`);
  for (const [field, n] of summary.rejectionFields.slice(0, 12)) {
    lines.push(`    ${String(n).padStart(5)}  ${field}`);
  }
  if (summary.violations.length === 0) {
    lines.push('  no violation: every case ended in a result or a clear error within the limits');
  } else {
    lines.push(`  VIOLATIONS (${summary.violations.length}):`);
    for (const v of summary.violations.slice(0, 50)) {
      lines.push(
        `    case ${v.index} [${v.kind}] ${v.shape} / ${v.mutation}\n      ${v.detail.split('\n').slice(0, 6).join('\n      ')}`,
      );
      lines.push(`      replay: npm run fuzz -- --seed ${summary.seed} --case ${v.index}`);
    }
  }
  return lines.join('\n');
}

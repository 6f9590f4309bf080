import type {
  ConditionDifferenceView,
  ConditionPairSource,
  ConditionStatsView,
  TaskResultsView,
} from '@gyre/shared';
import { Card, Table, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { formatNumber, formatPValue } from '../../../lib/format';
import { DeltaFWithCi, FiguresTable } from './delta-f-cell';

/** How the two compared conditions were chosen, in words. */
export const PAIR_SOURCE_WORDS: Record<ConditionPairSource, string> = {
  settings: "named in the study's analysis settings",
  request: 'named for this computation',
  'first-two': 'the first two conditions found in the onsets (the settings name no pair)',
};

/** `Tone − Word`: the order of the subtraction. */
export function differenceName(difference: ConditionDifferenceView): string {
  return `${difference.first} − ${difference.second}`;
}

const columns: TableColumnsType<ConditionStatsView> = [
  {
    title: 'Condition',
    key: 'label',
    render: (_, row) => <span className="gyre-wrap-anywhere">{row.label}</span>,
  },
  {
    title: 'Trials kept',
    key: 'trials',
    align: 'right',
    render: (_, row) => `${row.trialsKept} of ${row.trialsTotal}`,
  },
  {
    title: 'Δf, 95 % CI (bootstrap)',
    key: 'deltaF',
    align: 'right',
    render: (_, row) => <DeltaFWithCi deltaFHz={row.deltaFHz} ciHz={row.ciHz} />,
  },
  {
    title: 'p (Wilcoxon)',
    key: 'p',
    align: 'right',
    render: (_, row) => formatPValue(row.pValue),
  },
];

/** The difference of the two compared conditions, as the table's last row. */
function DifferenceRow({ difference }: { difference: ConditionDifferenceView }) {
  return (
    <Table.Summary.Row>
      <Table.Summary.Cell index={0} colSpan={2}>
        <Typography.Text strong>Difference {differenceName(difference)}</Typography.Text>
      </Table.Summary.Cell>
      <Table.Summary.Cell index={2} align="right">
        <DeltaFWithCi deltaFHz={difference.differenceHz} ciHz={difference.ciHz} strong />
      </Table.Summary.Cell>
      <Table.Summary.Cell index={3} align="right">
        {formatPValue(difference.pValue)}
        <Typography.Text type="secondary" className="gyre-block gyre-review-small">
          (permutation)
        </Typography.Text>
      </Table.Summary.Cell>
    </Table.Summary.Row>
  );
}

/** What the difference row is and how its pair was chosen. */
function DifferenceNote({ difference }: { difference: ConditionDifferenceView }) {
  return (
    <Typography.Paragraph type="secondary" style={{ fontSize: 13, marginTop: 8, marginBottom: 0 }}>
      The last row is a difference, not a condition: mean Δf of “{difference.first}” minus mean Δf
      of “{difference.second}”, the pair {PAIR_SOURCE_WORDS[difference.chosenBy]}. Its 95 % CI
      resamples trials within each condition; its p comes from a permutation test (
      {formatNumber(difference.permutations, 0)} label shuffles, fixed seed {difference.seed}).
    </Typography.Paragraph>
  );
}

/**
 * Δf per condition (onset label) in the region of interest, and the difference of the two
 * compared conditions. Nothing is shown for a recording whose onsets carry no labels.
 */
export function ConditionsTable({ task }: { task: TaskResultsView }) {
  if (task.conditions.length === 0) return null;
  const difference = task.conditionDifference;
  return (
    <Card
      type="inner"
      size="small"
      title="Conditions"
      aria-label="Conditions"
      style={{ marginTop: 16 }}
    >
      <FiguresTable<ConditionStatsView>
        aria-label="Δf per condition"
        rowKey="label"
        columns={columns}
        dataSource={task.conditions}
        summary={() => (difference === null ? null : <DifferenceRow difference={difference} />)}
      />
      {difference === null ? (
        <Typography.Paragraph
          type="secondary"
          style={{ fontSize: 13, marginTop: 8, marginBottom: 0 }}
        >
          No difference: it needs two conditions with kept trials.
        </Typography.Paragraph>
      ) : (
        <DifferenceNote difference={difference} />
      )}
    </Card>
  );
}

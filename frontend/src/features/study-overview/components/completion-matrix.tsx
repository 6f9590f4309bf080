import type { CompletionState, OverviewCell, StudyOverviewView } from '@gyre/shared';
import { Table, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';

/** Each state in words with a sign, so the matrix never relies on colour alone. */
export const STATE_WORDS: Record<CompletionState, { sign: string; word: string; colour: string }> =
  {
    missing: { sign: '○', word: 'missing', colour: 'rgba(29,43,47,0.55)' },
    uploaded: { sign: '◔', word: 'uploaded', colour: GYRE_COLORS.ink },
    computed: { sign: '◑', word: 'computed', colour: GYRE_COLORS.ink },
    reviewed: { sign: '◕', word: 'reviewed', colour: GYRE_COLORS.primary },
    signed: { sign: '●', word: 'signed', colour: GYRE_COLORS.primary },
  };

function CellText({ cell }: { cell: OverviewCell }) {
  const words = STATE_WORDS[cell.state];
  return (
    <span style={{ whiteSpace: 'nowrap', color: words.colour }}>
      <span aria-hidden="true">{words.sign} </span>
      {words.word}
      {cell.changedSinceSigning && (
        <Typography.Text type="warning" className="gyre-block gyre-caption">
          changed since signing
        </Typography.Text>
      )}
      {cell.doubts.length > 0 && (
        <Typography.Text
          type="warning"
          className="gyre-block gyre-caption"
          title={cell.doubts.join(' ')}
        >
          {cell.doubts.length === 1 ? '1 doubt' : `${cell.doubts.length} doubts`}
        </Typography.Text>
      )}
    </span>
  );
}

interface Row {
  id: string;
  code: string;
  where: string;
  cells: OverviewCell[];
}

/** Participants × planned visits, each cell the visit's state in words (scrolls sideways on a phone). */
export function CompletionMatrix({ overview }: { overview: StudyOverviewView }) {
  const siteName = new Map(overview.sites.map((s) => [s.id, s.name]));
  const groupName = new Map(overview.groups.map((g) => [g.id, g.name]));
  const rows: Row[] = overview.participants.map((p) => ({
    id: p.id,
    code: p.code,
    where: `${siteName.get(p.siteId) ?? 'Site'} · ${p.groupId === null ? 'no group' : (groupName.get(p.groupId) ?? 'group')}`,
    cells: p.cells,
  }));
  const counts = overview.plannedVisits.map((_, i) => {
    const done = overview.participants.filter((p) => p.cells[i].state !== 'missing').length;
    return `${done} of ${overview.participants.length}`;
  });
  return (
    <>
      <Typography.Paragraph type="secondary" style={{ fontSize: 13 }}>
        {(Object.keys(STATE_WORDS) as CompletionState[]).map((state) => (
          <span key={state} style={{ marginRight: 16, whiteSpace: 'nowrap' }}>
            <span aria-hidden="true">{STATE_WORDS[state].sign} </span>
            {STATE_WORDS[state].word}
          </span>
        ))}
      </Typography.Paragraph>
      <Table<Row>
        aria-label="Completion matrix"
        rowKey="id"
        size="small"
        pagination={overview.participants.length > 50 ? { pageSize: 50 } : false}
        scroll={{ x: 'max-content' }}
        dataSource={rows}
        locale={{ emptyText: 'No participant in this study yet.' }}
        columns={[
          {
            key: 'participant',
            title: 'Participant',
            fixed: 'left',
            render: (_, row) => (
              <span className="gyre-nowrap">
                <span className="gyre-figures">{row.code}</span>
                <Typography.Text type="secondary" className="gyre-block gyre-caption">
                  {row.where}
                </Typography.Text>
              </span>
            ),
          },
          ...overview.plannedVisits.map((pv, i) => ({
            key: pv.id,
            title: (
              <span className="gyre-nowrap">
                {pv.name}
                <Typography.Text type="secondary" className="gyre-block gyre-caption">
                  day {pv.targetDay} · {counts[i]} present
                </Typography.Text>
              </span>
            ),
            render: (_: unknown, row: Row) => <CellText cell={row.cells[i]} />,
          })),
        ]}
      />
    </>
  );
}

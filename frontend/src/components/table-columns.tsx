import { Tag, type TableColumnsType } from 'antd';
import { formatDateTime } from '../lib/format';

type Column<Row> = TableColumnsType<Row>[number];

/** How a state shows as a tag: its word and an antd status or theme colour. */
export interface StateLook {
  label: string;
  color: string;
}

/** A column of a date and time in tabular figures (an empty one shows the no-value mark). */
export function dateTimeColumn<Row>(
  title: string,
  dataIndex: keyof Row & string,
  width: number,
): Column<Row> {
  return {
    title,
    dataIndex,
    width,
    render: (at: string | null) => <span className="gyre-figures">{formatDateTime(at)}</span>,
  };
}

/** A state as a tag, in its words and colour. */
export function StateTag({ look }: { look: StateLook }) {
  return <Tag color={look.color}>{look.label}</Tag>;
}

/** A `state` column showing each row's state as a tag, in the words and colours of `looks`. */
export function stateTagColumn<Row extends { state: State }, State extends string>(
  looks: Record<State, StateLook>,
  width: number,
): Column<Row> {
  return {
    title: 'State',
    dataIndex: 'state',
    width,
    render: (state: State) => <StateTag look={looks[state]} />,
  };
}

/** The choices of a filter by state: "All", then each state of `looks` in its words and order. */
export function stateFilterOptions<State extends string>(
  looks: Record<State, StateLook>,
): { label: string; value: State | 'all' }[] {
  const states = Object.entries(looks) as [State, StateLook][];
  return [
    { label: 'All', value: 'all' },
    ...states.map(([value, { label }]) => ({ label, value })),
  ];
}

import { AUDIT_ACTIONS } from '@gyre/shared';
import { DatePicker, Flex, Form, Input, Select } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { useAuditPeople } from '../api/audit-people';
import type { AuditFilters } from '../api/audit-filters';

/** Verbs written by feature modules beside the account verbs listed in shared/. */
const FEATURE_ACTIONS = ['upload', 'reject', 'rerun', 'raise', 'clear', 'sign', 'send', 'read'];
const ACTIONS = [...new Set([...AUDIT_ACTIONS, ...FEATURE_ACTIONS])].sort();

const OBJECT_TYPES = [
  'AnalysisRun',
  'AnalysisSettings',
  'AuditEntry',
  'Flag',
  'Participant',
  'Recording',
  'Report',
  'Session',
  'Site',
  'Study',
  'User',
  'Visit',
];

/** Person, action, object and date range; every change applies at once. */
export function LedgerFilters({
  filters,
  onChange,
}: {
  filters: AuditFilters;
  onChange: (filters: AuditFilters) => void;
}) {
  const people = useAuditPeople();
  const set = (change: Partial<AuditFilters>) => onChange({ ...filters, ...change });
  const range: [Dayjs, Dayjs] | null =
    filters.from !== undefined && filters.to !== undefined
      ? [dayjs(filters.from), dayjs(filters.to)]
      : null;

  return (
    <Form layout="vertical" component="div" style={{ marginBottom: 8 }}>
      <Flex gap={12} wrap>
        <Form.Item label="Person" htmlFor="ledger-person" style={{ width: 240, marginBottom: 8 }}>
          <Select
            id="ledger-person"
            allowClear
            showSearch={{ optionFilterProp: 'label' }}
            placeholder="Anyone"
            loading={people.isLoading}
            value={filters.actorId}
            onChange={(actorId: string | undefined) => set({ actorId })}
            notFoundContent={
              people.error !== undefined ? 'The people could not be loaded' : undefined
            }
            options={(people.data?.items ?? []).map((user) => ({
              value: user.id,
              label: `${user.name} (${user.email})`,
            }))}
          />
        </Form.Item>
        <Form.Item label="Action" htmlFor="ledger-action" style={{ width: 170, marginBottom: 8 }}>
          <Select
            id="ledger-action"
            allowClear
            showSearch
            placeholder="Any action"
            value={filters.action}
            onChange={(action: string | undefined) => set({ action })}
            options={ACTIONS.map((action) => ({ value: action, label: action }))}
          />
        </Form.Item>
        <Form.Item label="Object" htmlFor="ledger-object" style={{ width: 170, marginBottom: 8 }}>
          <Select
            id="ledger-object"
            allowClear
            showSearch
            placeholder="Any object"
            value={filters.objectType}
            onChange={(objectType: string | undefined) => set({ objectType })}
            options={OBJECT_TYPES.map((type) => ({ value: type, label: type }))}
          />
        </Form.Item>
        <Form.Item
          label="Object id"
          htmlFor="ledger-object-id"
          style={{ width: 170, marginBottom: 8 }}
        >
          <Input.Search
            id="ledger-object-id"
            allowClear
            placeholder="Any"
            defaultValue={filters.objectId}
            onSearch={(objectId) => set({ objectId: objectId.trim() || undefined })}
          />
        </Form.Item>
        <Form.Item label="Date range" style={{ marginBottom: 8 }}>
          <DatePicker.RangePicker
            format="D MMM YYYY"
            value={range}
            aria-label="Date range"
            onChange={(dates) => {
              const [start, end] = dates ?? [null, null];
              set(
                start !== null && end !== null
                  ? { from: start.startOf('day').toISOString(), to: end.endOf('day').toISOString() }
                  : { from: undefined, to: undefined },
              );
            }}
          />
        </Form.Item>
      </Flex>
    </Form>
  );
}

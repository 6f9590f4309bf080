import { AUDIT_ACTIONS } from '@gyre/shared';
import { DatePicker, Flex, Form, Grid, Input, Select } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { useState } from 'react';
import { useAppAbility } from '../../../lib/session/ability';
import { useAuditPeople } from '../api/audit-people';
import type { AuditFilters } from '../api/audit-filters';
import { useLedgerParticipant, useLedgerParticipants } from '../api/ledger-participants';

/** Verbs written by feature modules beside the account verbs listed in shared/. */
const FEATURE_ACTIONS = [
  'upload',
  'validate',
  'accept',
  'reject',
  'compute',
  'ready',
  'fail',
  'supersede',
  'rerun',
  'retry',
  'recompute',
  'download',
  'raise',
  'clear',
  'review',
  'sign',
  'notify',
  'sent',
  'revoke',
];
const ACTIONS = [...new Set([...AUDIT_ACTIONS, ...FEATURE_ACTIONS])].sort();

/** What an entry can be about, in words (the value is the recorded object type). */
const OBJECT_TYPES: [string, string][] = [
  ['AnalysisRun', 'Analysis run'],
  ['AnalysisSettings', 'Analysis settings'],
  ['AuditEntry', 'Ledger'],
  ['Flag', 'Slowing flag'],
  ['Participant', 'Participant'],
  ['PlannedVisit', 'Planned visit'],
  ['Recording', 'Recording'],
  ['Report', 'Report'],
  ['Session', 'Sign-in session'],
  ['Site', 'Site'],
  ['Study', 'Study'],
  ['StudyGroup', 'Study group'],
  ['User', 'Account'],
  ['Visit', 'Visit'],
  ['VisitAnalysisOverride', 'Visit analysis settings'],
  ['VisitReview', 'Visit review'],
  ['WorkerToken', 'Worker token'],
];

/** Person, participant, action, object and dates; every change applies at once. */
export function LedgerFilters({
  filters,
  onChange,
}: {
  filters: AuditFilters;
  onChange: (filters: AuditFilters) => void;
}) {
  const ability = useAppAbility();
  // Side by side from the small breakpoint up; one under the other, full width, on a phone.
  const narrow = Grid.useBreakpoint().sm !== true;
  const item = { width: narrow ? '100%' : 220, marginBottom: 8 } as const;
  const canReadParticipants = ability.can('read', 'Participant');
  const people = useAuditPeople();
  const [participantSearch, setParticipantSearch] = useState('');
  const participants = useLedgerParticipants(participantSearch, canReadParticipants);
  const chosen = useLedgerParticipant(filters.participantId, canReadParticipants);
  const set = (change: Partial<AuditFilters>) => onChange({ ...filters, ...change });
  const participantOptions = (participants.data?.items ?? []).map((p) => ({
    value: p.id,
    label: p.code,
  }));
  if (chosen.data !== undefined && !participantOptions.some((o) => o.value === chosen.data?.id)) {
    participantOptions.unshift({ value: chosen.data.id, label: chosen.data.code });
  }

  return (
    <Form layout="vertical" component="div" className="gyre-below-xs">
      <Flex gap={12} wrap>
        <Form.Item label="Person" htmlFor="ledger-person" style={item}>
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
        {canReadParticipants && (
          <Form.Item label="Participant" htmlFor="ledger-participant" style={item}>
            <Select
              id="ledger-participant"
              allowClear
              showSearch={{ filterOption: false, onSearch: setParticipantSearch }}
              placeholder="Any participant (type a code)"
              loading={participants.isLoading}
              value={filters.participantId}
              onChange={(participantId: string | undefined) => {
                setParticipantSearch('');
                set({ participantId });
              }}
              notFoundContent={
                participants.error !== undefined
                  ? 'The participants could not be loaded'
                  : 'No participant with that code'
              }
              options={participantOptions}
            />
          </Form.Item>
        )}
        <Form.Item label="Action" htmlFor="ledger-action" style={item}>
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
        <Form.Item label="About" htmlFor="ledger-object" style={item}>
          <Select
            id="ledger-object"
            allowClear
            showSearch={{ optionFilterProp: 'label' }}
            placeholder="Anything"
            value={filters.objectType}
            onChange={(objectType: string | undefined) => set({ objectType })}
            options={OBJECT_TYPES.map(([value, label]) => ({ value, label }))}
          />
        </Form.Item>
        <Form.Item label="Object id" htmlFor="ledger-object-id" style={item}>
          <Input
            id="ledger-object-id"
            allowClear
            placeholder="Any (Enter to apply)"
            defaultValue={filters.objectId}
            onPressEnter={(event) =>
              set({ objectId: event.currentTarget.value.trim() || undefined })
            }
            onClear={() => set({ objectId: undefined })}
          />
        </Form.Item>
        <Form.Item label="From date" htmlFor="ledger-from" style={item}>
          <DayPicker
            id="ledger-from"
            label="From date"
            value={filters.from}
            onChange={(date) => set({ from: date?.startOf('day').toISOString() })}
          />
        </Form.Item>
        <Form.Item label="To date" htmlFor="ledger-to" style={item}>
          <DayPicker
            id="ledger-to"
            label="To date"
            value={filters.to}
            onChange={(date) => set({ to: date?.endOf('day').toISOString() })}
          />
        </Form.Item>
      </Flex>
    </Form>
  );
}

/** A day bound of the filters: the ISO instant shown as its day, and the picked day or none. */
function DayPicker({
  id,
  label,
  value,
  onChange,
}: {
  id: string;
  label: string;
  value: string | undefined;
  onChange: (date: Dayjs | null) => void;
}) {
  return (
    <DatePicker
      id={id}
      aria-label={label}
      format="D MMM YYYY"
      className="gyre-fill-width"
      value={value !== undefined ? dayjs(value) : null}
      onChange={onChange}
    />
  );
}

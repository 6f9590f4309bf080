import type { PlannedVisitView } from '@gyre/shared';
import { Form, Input, InputNumber, Space } from 'antd';
import { ModalForm } from '../../../components/modal-form';
import { usePlannedVisits } from '../../../lib/study-schedule';
import { useScheduleWrites, type PlannedVisitInput } from '../api/study-schedule';
import { EditableListSection } from './editable-list-section';

/** "−14 / +14 days"; a side without slack reads "on the day" ("up to 14 days after"). */
export function windowText(p: Pick<PlannedVisitView, 'windowBeforeDays' | 'windowAfterDays'>) {
  const before = p.windowBeforeDays;
  const after = p.windowAfterDays;
  if (before === 0 && after === 0) return 'on the day';
  if (before === 0) return `up to ${after} days after`;
  if (after === 0) return `up to ${before} days before`;
  return `−${before} / +${after} days`;
}

/**
 * The study's visit schedule: each planned visit's target day after enrolment and its window.
 * Admins add, change and delete planned visits (one in use cannot be deleted); others read.
 */
export function VisitScheduleSection({
  studyId,
  canManage,
}: {
  studyId: string;
  canManage: boolean;
}) {
  const schedule = usePlannedVisits(studyId);
  const writes = useScheduleWrites(studyId);
  return (
    <EditableListSection<PlannedVisitView, PlannedVisitInput>
      title="Visit schedule"
      addText="Add planned visit"
      intro={
        <>
          Days count from each participant&apos;s enrolment date (day 0). A visit registered outside
          its planned visit&apos;s window is marked early or late wherever it is listed.
        </>
      }
      tableLabel="Planned visits"
      list={schedule}
      loadErrorTitle="The schedule could not be loaded"
      emptyText={
        canManage
          ? 'No planned visits yet: visits are registered with labels of their own until you add some.'
          : 'The study has no visit schedule: visits are registered with labels of their own.'
      }
      columns={[
        { key: 'name', title: 'Planned visit', render: (_, p) => p.name },
        {
          key: 'targetDay',
          title: 'Target day',
          align: 'right',
          className: 'gyre-figures gyre-nowrap',
          render: (_, p) => `day ${p.targetDay}`,
        },
        {
          key: 'window',
          title: 'Allowed window',
          className: 'gyre-figures',
          render: (_, p) => windowText(p),
        },
      ]}
      canManage={canManage}
      deleteDescription="Only a planned visit no visit was registered on can be deleted."
      deletedText={(p) => `${p.name} deleted from the schedule.`}
      deleteFailureText="The planned visit could not be deleted."
      onDelete={writes.deletePlannedVisit}
      onSave={writes.savePlannedVisit}
      renderForm={({ item, onClose, onSave }) => (
        <PlannedVisitForm
          planned={item}
          nextPosition={schedule.data?.length ?? 0}
          onClose={onClose}
          onSave={onSave}
        />
      )}
    />
  );
}

const dayRules = [
  { required: true, message: 'Give a whole number of days.' },
  { type: 'integer' as const, min: 0, message: 'A whole number of days, 0 or more.' },
];

function PlannedVisitForm({
  planned,
  nextPosition,
  onClose,
  onSave,
}: {
  planned: PlannedVisitView | null;
  nextPosition: number;
  onClose: () => void;
  onSave: (input: PlannedVisitInput) => Promise<void>;
}) {
  return (
    <ModalForm<PlannedVisitInput>
      title={planned === null ? 'New planned visit' : `Change ${planned.name}`}
      okText="Save planned visit"
      failureText="The planned visit could not be saved."
      initialValues={
        planned ?? {
          targetDay: undefined,
          windowBeforeDays: 0,
          windowAfterDays: 0,
          position: nextPosition,
        }
      }
      onSubmit={(values) => onSave({ ...values, name: values.name.trim() })}
      onClose={onClose}
    >
      <Form.Item
        label="Name"
        name="name"
        extra="Visits registered on it take this name, e.g. Baseline, Week 12."
        rules={[
          { required: true, whitespace: true, message: 'Give the planned visit a name.' },
          { max: 40, message: 'A name has at most 40 characters.' },
        ]}
      >
        <Input autoFocus />
      </Form.Item>
      <Form.Item label="Target day after enrolment" name="targetDay" rules={dayRules}>
        <InputNumber min={0} precision={0} suffix="days" className="gyre-fill-width" />
      </Form.Item>
      <Space.Compact block>
        <Form.Item
          label="Window before"
          name="windowBeforeDays"
          rules={dayRules}
          style={{ flex: 1 }}
        >
          <InputNumber min={0} precision={0} suffix="days" className="gyre-fill-width" />
        </Form.Item>
        <Form.Item label="Window after" name="windowAfterDays" rules={dayRules} style={{ flex: 1 }}>
          <InputNumber min={0} precision={0} suffix="days" className="gyre-fill-width" />
        </Form.Item>
      </Space.Compact>
      <Form.Item label="Order in the schedule" name="position" rules={dayRules}>
        <InputNumber min={0} precision={0} className="gyre-fill-width" />
      </Form.Item>
    </ModalForm>
  );
}

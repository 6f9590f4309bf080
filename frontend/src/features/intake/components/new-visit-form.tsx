import { visitScheduleStatus, type PlannedVisitView, type VisitView } from '@gyre/shared';
import { Form, Input, Select, Space, Typography } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { ModalForm } from '../../../components/modal-form';
import { studyDayText, VisitWindowTag } from '../../../components/visit-window-tag';
import { formatDate } from '../../../lib/format';
import { useCreateVisit, type CreateVisitBody } from '../api/create-visit';
import { PastDateField } from './past-date-field';

/** The Select's value for a visit outside the schedule. */
export const UNSCHEDULED = 'unscheduled';

interface Values {
  plannedVisit?: string;
  label?: string;
  visitDate?: Dayjs;
}

/** "day 84, −14/+14 days" */
function windowWords(planned: PlannedVisitView): string {
  return `day ${planned.targetDay}, −${planned.windowBeforeDays}/+${planned.windowAfterDays} days`;
}

/**
 * Registers a visit. When the study has a schedule the visit is one of its planned visits
 * (each once per participant), or explicitly "unscheduled" with a label of its own; the form
 * shows at once whether the date falls inside the planned visit's window.
 */
export function NewVisitForm({
  open,
  participantId,
  participantCode,
  enrolmentDate,
  schedule,
  visits,
  onClose,
  onCreated,
}: {
  open: boolean;
  participantId: string;
  participantCode: string;
  enrolmentDate: string | null;
  /** The study's planned visits, in order (empty: the study has no schedule). */
  schedule: PlannedVisitView[];
  /** The participant's visits so far. */
  visits: VisitView[];
  onClose: () => void;
  onCreated: (visit: VisitView) => void;
}) {
  const [form] = Form.useForm<Values>();
  const createVisit = useCreateVisit();
  const pick = Form.useWatch('plannedVisit', form);
  const date = Form.useWatch('visitDate', form);
  const hasSchedule = schedule.length > 0;
  const planned = schedule.find((p) => p.id === pick) ?? null;
  const needsLabel = !hasSchedule || pick === UNSCHEDULED;
  const done = new Map(
    visits.flatMap((v) => (v.plannedVisitId === null ? [] : [[v.plannedVisitId, v] as const])),
  );
  const status =
    planned !== null && dayjs.isDayjs(date)
      ? visitScheduleStatus({
          visitDate: date.format('YYYY-MM-DD'),
          enrolmentDate,
          planned,
        })
      : null;

  const submit = async (values: Values) => {
    const visitDate = (values.visitDate as Dayjs).format('YYYY-MM-DD');
    const body: CreateVisitBody =
      values.plannedVisit !== undefined && values.plannedVisit !== UNSCHEDULED
        ? { participantId, plannedVisitId: values.plannedVisit, visitDate }
        : {
            participantId,
            ...(hasSchedule ? { unscheduled: true } : {}),
            label: (values.label ?? '').trim(),
            visitDate,
          };
    const visit = await createVisit(body);
    form.resetFields();
    onCreated(visit);
  };

  return (
    <ModalForm<Values>
      open={open}
      form={form}
      title={`New visit for ${participantCode}`}
      okText="Register visit"
      failureText="The visit could not be saved."
      onSubmit={submit}
      onClose={onClose}
    >
      {hasSchedule && (
        <Form.Item
          label="Planned visit"
          name="plannedVisit"
          extra="The visit of the study's schedule this is. Each planned visit happens once per participant."
          rules={[{ required: true, message: 'Choose the planned visit, or "Unscheduled".' }]}
        >
          <Select
            autoFocus
            placeholder="Choose a planned visit"
            options={[
              ...schedule.map((p) => {
                const taken = done.get(p.id);
                return {
                  value: p.id,
                  disabled: taken !== undefined,
                  label:
                    taken === undefined
                      ? `${p.name} · ${windowWords(p)}`
                      : `${p.name} · done on ${formatDate(taken.visitDate)}`,
                };
              }),
              { value: UNSCHEDULED, label: 'Unscheduled visit (outside the schedule)' },
            ]}
          />
        </Form.Item>
      )}
      {needsLabel && (
        <Form.Item
          label="Visit label"
          name="label"
          extra={
            hasSchedule
              ? 'A name for this extra visit, e.g. "Repeat rest".'
              : 'As your protocol names it, e.g. V1, V2, Month 6.'
          }
          rules={[
            { required: true, whitespace: true, message: 'Give the visit a label.' },
            { max: 40, message: 'A label has at most 40 characters.' },
            {
              validator: async (_rule, value: unknown) => {
                if (typeof value !== 'string') return;
                const wanted = value.trim().toLowerCase();
                if (visits.some((v) => v.label.toLowerCase() === wanted)) {
                  throw new Error(
                    `${participantCode} already has a visit labelled ${value.trim()}.`,
                  );
                }
              },
            },
          ]}
        >
          <Input autoFocus={!hasSchedule} />
        </Form.Item>
      )}
      <PastDateField
        name="visitDate"
        label="Visit date"
        noun="visit date"
        requiredMessage="Choose the date of the visit."
      />
      {status !== null && (
        <div role="status" aria-label="Window status" className="gyre-below">
          <Space wrap size={8}>
            <VisitWindowTag schedule={status} />
            <Typography.Text type="secondary">{studyDayText(status)}</Typography.Text>
          </Space>
          {(status.window === 'early' || status.window === 'late') && (
            <Typography.Paragraph type="secondary" className="gyre-flush gyre-above-xs">
              The visit can still be registered; it is marked as outside its window.
            </Typography.Paragraph>
          )}
        </div>
      )}
    </ModalForm>
  );
}

import type {
  AnalysisSettingsValues,
  VisitAnalysisOverrideChange,
  VisitAnalysisOverrideView,
} from '@gyre/shared';
import { Alert, Form, Input, Modal, Radio, Select, Typography } from 'antd';
import { useSubmission } from '../../../lib/use-submission';
import { ANALYSIS_OVERRIDE_UNCHANGED } from '../api/save-visit-override';
import type { ChannelOption } from './channel-names';
import { formatHzRange } from '../../../lib/format';
import { BandEdgeFields } from '../../../components/band-edge-fields';
import { reasonRules } from './reason-rules';

export const OVERRIDE_REASON_MIN_LENGTH = 10;

type Choice = 'study' | 'visit';

export interface OverrideFormValues {
  roiMode: Choice;
  roi: string[];
  bandMode: Choice;
  bandLowHz: number | null;
  bandHighHz: number | null;
  onsetMode: Choice;
  onsetLabel: string;
  reason: string;
}

type StudyValues = Pick<AnalysisSettingsValues, 'roi' | 'bandHz' | 'onsetLabel'>;

export function overrideFormValuesOf(
  override: VisitAnalysisOverrideView,
  study: StudyValues | undefined,
): OverrideFormValues {
  const band = override.bandHz ?? study?.bandHz ?? [8, 13];
  return {
    roiMode: override.roi === null ? 'study' : 'visit',
    roi: override.roi ?? study?.roi ?? [],
    bandMode: override.bandHz === null ? 'study' : 'visit',
    bandLowHz: band[0],
    bandHighHz: band[1],
    onsetMode: override.onsetLabel === null ? 'study' : 'visit',
    onsetLabel: override.onsetLabel ?? study?.onsetLabel ?? '',
    reason: '',
  };
}

/** The change to send; each choice left to the study is null. */
export function overrideChangeOf(values: OverrideFormValues): VisitAnalysisOverrideChange {
  return {
    roi: values.roiMode === 'visit' ? values.roi : null,
    bandHz:
      values.bandMode === 'visit' && values.bandLowHz !== null && values.bandHighHz !== null
        ? [values.bandLowHz, values.bandHighHz]
        : null,
    onsetLabel: values.onsetMode === 'visit' ? values.onsetLabel.trim() : null,
    reason: values.reason.trim(),
  };
}

const studyBandText = (study: StudyValues | undefined) =>
  study === undefined
    ? "The study's band"
    : study.bandHz === null
      ? "The study's: the visit's IAF ± 2 Hz (8–13 Hz without one)"
      : `The study's: ${formatHzRange(study.bandHz)}`;

/**
 * The visit's own region of interest, band and onset label over the study's settings, with a
 * reason; saving computes the visit's recordings again.
 */
export function OverrideForm({
  open,
  override,
  study,
  channelOptions,
  onSave,
  onClose,
  onSaved,
}: {
  open: boolean;
  override: VisitAnalysisOverrideView;
  study: StudyValues | undefined;
  /** The file's channels, by their 10-10 names. */
  channelOptions: ChannelOption[];
  onSave: (change: VisitAnalysisOverrideChange) => Promise<VisitAnalysisOverrideView>;
  onClose: () => void;
  onSaved: (saved: VisitAnalysisOverrideView) => void;
}) {
  const [form] = Form.useForm<OverrideFormValues>();
  const {
    busy: saving,
    error,
    errorCode,
    run,
  } = useSubmission("The visit's choices could not be saved.");
  const failure =
    error === null
      ? null
      : { unchanged: errorCode === ANALYSIS_OVERRIDE_UNCHANGED, message: error };
  const roiMode = Form.useWatch('roiMode', form);
  const bandMode = Form.useWatch('bandMode', form);
  const onsetMode = Form.useWatch('onsetMode', form);
  const initial = overrideFormValuesOf(override, study);
  // A chosen name the files do not hold still shows, so nothing is dropped silently.
  const options = [
    ...channelOptions,
    ...initial.roi
      .filter((name) => !channelOptions.some((o) => o.value === name))
      .map((name) => ({ value: name, label: `${name} (not in this visit's files)` })),
  ];

  const submit = (values: OverrideFormValues) =>
    run(async () => {
      onSaved(await onSave(overrideChangeOf({ ...initial, ...values })));
    });

  return (
    <Modal
      open={open}
      title="This visit's analysis choices"
      okText="Save and re-run this visit"
      onOk={() => form.submit()}
      okButtonProps={{ loading: saving }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Typography.Paragraph type="secondary">
        For this visit only: other visits keep the study&apos;s settings. Saving computes this
        visit&apos;s recordings again with these choices.
      </Typography.Paragraph>
      <Form<OverrideFormValues>
        form={form}
        name="visit-override"
        aria-label="This visit's analysis choices"
        layout="vertical"
        requiredMark={false}
        initialValues={initial}
        onFinish={submit}
      >
        <StudyOrVisitItem
          name="roiMode"
          label="Region of interest"
          studyLabel={
            study === undefined
              ? "The study's region of interest"
              : `The study's: ${study.roi.join(', ')}`
          }
          visitLabel="Channels chosen for this visit"
        />
        {roiMode === 'visit' && (
          <Form.Item
            name="roi"
            label="Channels for this visit"
            extra="The scalp channels of this visit's files, by their 10-10 names."
            rules={[
              { required: true, type: 'array', min: 1, message: 'Choose at least one channel.' },
            ]}
          >
            <Select mode="multiple" options={options} optionFilterProp="label" />
          </Form.Item>
        )}
        <StudyOrVisitItem
          name="bandMode"
          label="Alpha band"
          studyLabel={studyBandText(study)}
          visitLabel="A fixed band for this visit"
        />
        {bandMode === 'visit' && <BandEdgeFields />}
        <StudyOrVisitItem
          name="onsetMode"
          label="Onsets"
          studyLabel={
            study === undefined
              ? "The study's onset label"
              : study.onsetLabel === null
                ? "The study's: every onset"
                : `The study's: “${study.onsetLabel}”`
          }
          visitLabel="Another onset label for this visit"
        />
        {onsetMode === 'visit' && (
          <Form.Item
            name="onsetLabel"
            label="Onset label for this visit"
            extra="Annotation text or CSV label of the onsets to use."
            rules={[{ required: true, whitespace: true, message: 'Enter the onset label.' }]}
          >
            <Input maxLength={200} />
          </Form.Item>
        )}
        <Form.Item
          name="reason"
          label="Why this visit needs its own choices"
          rules={reasonRules(OVERRIDE_REASON_MIN_LENGTH)}
        >
          <Input.TextArea rows={2} maxLength={2000} />
        </Form.Item>
        {failure !== null && (
          <Alert
            role="alert"
            type={failure.unchanged ? 'info' : 'error'}
            showIcon
            title={failure.unchanged ? 'Nothing changed' : failure.message}
            description={
              failure.unchanged ? `${failure.message} Nothing was saved or re-run.` : undefined
            }
          />
        )}
      </Form>
    </Modal>
  );
}

/** One setting's choice: the study's value (described), or one for this visit only. */
function StudyOrVisitItem({
  name,
  label,
  studyLabel,
  visitLabel,
}: {
  name: 'roiMode' | 'bandMode' | 'onsetMode';
  label: string;
  studyLabel: string;
  visitLabel: string;
}) {
  return (
    <Form.Item name={name} label={label}>
      <Radio.Group
        options={[
          { value: 'study', label: studyLabel },
          { value: 'visit', label: visitLabel },
        ]}
      />
    </Form.Item>
  );
}

import type { AnalysisSettingsChange, AnalysisSettingsView } from '@gyre/shared';
import {
  Alert,
  Button,
  Col,
  Flex,
  Form,
  Input,
  InputNumber,
  Radio,
  Row,
  Select,
  Typography,
} from 'antd';
import type { FormRule } from 'antd';
import { useSubmission } from '../../../lib/use-submission';
import { ANALYSIS_SETTINGS_UNCHANGED } from '../api/create-analysis-settings';
import {
  changeOf,
  formValuesOf,
  REASON_MIN_LENGTH,
  type SettingsFormValues,
} from './settings-form-values';
import { BandEdgeFields } from '../../../components/band-edge-fields';
import { HalfRowNumberField } from '../../../components/half-row-number-field';
import { checkWhenFilled } from '../../../lib/check-when-filled';
import { DepthSettingsFields } from './depth-settings-fields';

type Values = SettingsFormValues;

const required = (what: string): FormRule => ({ required: true, message: `Enter ${what}.` });

/** A rule comparing this field with others; limits are those the server checks (common practice). */
const check = (
  test: (value: number, get: (name: keyof Values) => number | null) => string | null,
): FormRule =>
  checkWhenFilled<number, keyof Values>((value, get) =>
    test(value, (name) => {
      const v = get(name);
      return typeof v === 'number' ? v : null;
    }),
  );

const seconds = { suffix: 's', step: 0.1 } as const;

/** What went wrong with the last save: the server's refusal, or "nothing changed". */
interface Failure {
  kind: 'unchanged' | 'error';
  message: string;
}

/**
 * Changes the study's analysis settings: a new version, with a reason. Nothing is computed
 * again by it; Review shows which runs the new version would change.
 */
export function SettingsForm({
  current,
  onSave,
}: {
  current: AnalysisSettingsView;
  onSave: (change: AnalysisSettingsChange) => Promise<void>;
}) {
  const [form] = Form.useForm<Values>();
  const { busy: saving, error, errorCode, run } = useSubmission('The settings could not be saved.');
  const failure: Failure | null =
    error === null
      ? null
      : { kind: errorCode === ANALYSIS_SETTINGS_UNCHANGED ? 'unchanged' : 'error', message: error };
  const bandMode = Form.useWatch('bandMode', form);
  const method = Form.useWatch('method', form);

  const submit = () =>
    run(async () => {
      // Every value, also of fields hidden now (the wavelet cycles, a fixed band's edges):
      // a settings version is complete, whatever the form shows.
      const values: Values = { ...formValuesOf(current), ...form.getFieldsValue(true) };
      await onSave(changeOf(values));
      form.setFieldValue('reason', '');
    });

  const windowRule = (label: string, startField: keyof Values, isEnd: boolean) =>
    check((value, get) => {
      const epochStart = get('epochStartS');
      const epochEnd = get('epochEndS');
      const start = isEnd ? get(startField) : value;
      const end = isEnd ? value : null;
      if (isEnd && start !== null && end !== null && !(start < end)) {
        return `The ${label} must end after it starts.`;
      }
      if (epochStart !== null && epochEnd !== null && (value < epochStart || value > epochEnd)) {
        return `The ${label} must lie inside the epoch (${epochStart} to ${epochEnd} s).`;
      }
      return null;
    });

  return (
    <Form<Values>
      form={form}
      name="analysis-settings"
      layout="vertical"
      requiredMark={false}
      initialValues={formValuesOf(current)}
      onFinish={submit}
      aria-label="Analysis settings"
    >
      <Form.Item name="bandMode" label="Alpha band">
        <Radio.Group
          options={[
            { value: 'auto', label: "Visit's IAF ± 2 Hz (8–13 Hz without one)" },
            { value: 'fixed', label: 'Fixed band' },
          ]}
        />
      </Form.Item>
      {bandMode === 'fixed' && <BandEdgeFields />}
      <Row gutter={12}>
        <Col xs={24} sm={method === 'morlet' ? 14 : 24}>
          <Form.Item name="method" label="Narrow-band method">
            <Radio.Group
              options={[
                { value: 'filter', label: 'Zero-phase band-pass' },
                { value: 'morlet', label: 'Morlet wavelet' },
              ]}
            />
          </Form.Item>
        </Col>
        {method === 'morlet' && (
          <Col xs={24} sm={10}>
            <Form.Item
              name="morletCycles"
              label="Wavelet cycles"
              rules={[
                required('the number of cycles'),
                check((v) => (v < 3 || v > 20 ? 'Use 3 to 20 cycles.' : null)),
              ]}
            >
              <InputNumber step={1} className="gyre-fill-width" />
            </Form.Item>
          </Col>
        )}
      </Row>
      <Row gutter={12}>
        <HalfRowNumberField
          name="epochStartS"
          label="Epoch start"
          {...seconds}
          rules={[
            required('the epoch start'),
            check((v) => (v >= 0 ? 'The epoch must start before onset (below 0 s).' : null)),
          ]}
        />
        <HalfRowNumberField
          name="epochEndS"
          label="Epoch end"
          {...seconds}
          dependencies={['epochStartS']}
          rules={[
            required('the epoch end'),
            check((v, get) => {
              if (v <= 0) return 'The epoch must end after onset (above 0 s).';
              const start = get('epochStartS');
              return start !== null && v - start > 20 ? 'An epoch can be at most 20 s long.' : null;
            }),
          ]}
        />
        <HalfRowNumberField
          name="baselineStartS"
          label="Baseline start"
          {...seconds}
          dependencies={['epochStartS', 'epochEndS']}
          rules={[required('the baseline start'), windowRule('baseline', 'baselineStartS', false)]}
        />
        <HalfRowNumberField
          name="baselineEndS"
          label="Baseline end"
          {...seconds}
          dependencies={['baselineStartS', 'epochStartS', 'epochEndS']}
          rules={[
            required('the baseline end'),
            windowRule('baseline', 'baselineStartS', true),
            check((v) => (v > 0 ? 'The baseline must end at or before onset (0 s).' : null)),
          ]}
        />
        <HalfRowNumberField
          name="postStartS"
          label="Post start"
          {...seconds}
          dependencies={['baselineEndS', 'epochStartS', 'epochEndS']}
          rules={[
            required('the post-window start'),
            windowRule('post window', 'postStartS', false),
            check((v, get) => {
              const baselineEnd = get('baselineEndS');
              return baselineEnd !== null && v < baselineEnd
                ? `The post window must start at or after the baseline's end (${baselineEnd} s).`
                : null;
            }),
          ]}
        />
        <HalfRowNumberField
          name="postEndS"
          label="Post end"
          {...seconds}
          dependencies={['postStartS', 'epochStartS', 'epochEndS']}
          rules={[required('the post-window end'), windowRule('post window', 'postStartS', true)]}
        />
        <HalfRowNumberField
          name="rejectionThresholdUv"
          label="Reject epochs above"
          suffix="µV"
          step={10}
          rules={[
            required('the rejection threshold'),
            check((v) =>
              v <= 0 || v > 10_000 ? 'Use a threshold above 0 and at most 10000 µV.' : null,
            ),
          ]}
        />
        <HalfRowNumberField
          name="flagThresholdHz"
          label="Suggest a flag at Δf ≤"
          suffix="Hz"
          step={0.05}
          rules={[
            required('the flag threshold'),
            check((v) => (v >= 0 || v < -5 ? 'Use a negative change between −5 and 0 Hz.' : null)),
          ]}
        />
      </Row>
      <Form.Item
        name="roi"
        label="Region of interest (10-10 names)"
        rules={[
          { required: true, type: 'array', min: 1, message: 'Name at least one channel.' },
          {
            validator: async (_rule, names: string[] | undefined) => {
              const wrong = (names ?? []).filter((n) => !/^[A-Za-z]{1,2}([1-9]|10|z|Z)$/.test(n));
              if (wrong.length > 0)
                throw new Error(`Not a 10-10 electrode name: ${wrong.join(', ')}.`);
            },
          },
        ]}
      >
        <Select mode="tags" tokenSeparators={[',', ' ']} open={false} suffixIcon={null} />
      </Form.Item>
      <Form.Item
        name="onsetLabel"
        label="Onset label"
        extra="Annotation text or CSV label of the onsets to use; leave empty to use every onset."
      >
        <Input maxLength={200} />
      </Form.Item>
      <DepthSettingsFields />
      <Form.Item
        name="reason"
        label="Reason for the change"
        rules={[
          { required: true, whitespace: true, message: 'Say why the settings change.' },
          {
            min: REASON_MIN_LENGTH,
            message: `Write at least ${REASON_MIN_LENGTH} characters, so that the trail says why.`,
          },
        ]}
      >
        <Input.TextArea rows={2} maxLength={2000} />
      </Form.Item>
      {failure?.kind === 'unchanged' && (
        <Alert
          type="info"
          showIcon
          role="alert"
          title="Nothing changed"
          description={`${failure.message} No version was saved.`}
          style={{ marginBottom: 12 }}
        />
      )}
      {failure?.kind === 'error' && (
        <Alert
          type="error"
          showIcon
          title={failure.message}
          style={{ marginBottom: 12 }}
          role="alert"
        />
      )}
      <Flex gap={12} align="center" wrap>
        <Button type="primary" htmlType="submit" loading={saving}>
          Save version {current.version + 1}
        </Button>
        <Typography.Text type="secondary" style={{ fontSize: 13, flex: '1 1 220px' }}>
          Saving creates version {current.version + 1} for the whole study and re-runs nothing: runs
          keep their numbers; visits whose results would change show a notice in Review.
        </Typography.Text>
      </Flex>
    </Form>
  );
}

import { DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON } from '@gyre/shared';
import { Col, Form, Input, InputNumber, Row, Switch } from 'antd';
import { HalfRowNumberField } from '../../../components/half-row-number-field';
import { checkWhenFilled } from '../../../lib/check-when-filled';
import type { SettingsFormValues } from './settings-form-values';

type Field = keyof SettingsFormValues;

const text = (value: unknown): string => (typeof value === 'string' ? value.trim() : '');

/** Both condition labels or neither, and two different ones (labels match case-insensitively). */
const pairRule = (other: Field, thisOne: 'first' | 'second') =>
  checkWhenFilled<string, Field>((value, get) => {
    const mine = text(value);
    const theirs = text(get(other));
    if (mine === '' && theirs !== '') {
      return `Name the ${thisOne} condition too, or leave both empty (the first two found).`;
    }
    if (thisOne === 'second' && mine !== '' && mine.toLowerCase() === theirs.toLowerCase()) {
      return 'Name two different conditions.';
    }
    return null;
  });

/** The two condition inputs; each checks itself against the other. */
const COMPARED = [
  {
    name: 'compareFirst',
    other: 'compareSecond',
    which: 'first',
    extra:
      'Onset labels; the difference is first − second. Leave both empty to compare the first two found.',
  },
  { name: 'compareSecond', other: 'compareFirst', which: 'second', extra: undefined },
] as const;

/**
 * The analysis-depth settings: the amplitude gate (switching it on fills in the default
 * percentile), the threshold at which Review warns that the cycle-by-cycle and phase-based
 * Δf disagree, and the two conditions whose difference is reported. Limits are the server's.
 */
export function DepthSettingsFields() {
  const form = Form.useFormInstance<SettingsFormValues>();
  const gateOn = Form.useWatch('amplitudeGateOn', form) === true;

  const switchGate = (on: boolean) => {
    if (on && typeof form.getFieldValue('amplitudeGatePercentile') !== 'number') {
      form.setFieldValue('amplitudeGatePercentile', DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON);
    }
  };

  return (
    <>
      <Row gutter={12} align="bottom">
        <Col xs={24} sm={12}>
          <Form.Item
            name="amplitudeGateOn"
            label="Amplitude gate"
            valuePropName="checked"
            extra="Leave out instantaneous-frequency samples where the alpha envelope is weak."
          >
            <Switch onChange={switchGate} checkedChildren="On" unCheckedChildren="Off" />
          </Form.Item>
        </Col>
        {gateOn && (
          <HalfRowNumberField
            name="amplitudeGatePercentile"
            label="Envelope percentile"
            step={5}
            rules={[
              { required: true, message: 'Enter the envelope percentile.' },
              checkWhenFilled<number, Field>((v) =>
                v < 1 || v > 90 ? 'Use a percentile from 1 to 90.' : null,
              ),
            ]}
          />
        )}
      </Row>
      <Form.Item
        name="cycleDisagreementHz"
        label="Warn when the estimates differ by more than"
        extra="Review warns when the cycle-by-cycle Δf and the phase-based Δf differ by more."
        rules={[
          { required: true, message: 'Enter the disagreement threshold.' },
          checkWhenFilled<number, Field>((v) =>
            v <= 0 || v > 2 ? 'Use a difference above 0 and at most 2 Hz.' : null,
          ),
        ]}
      >
        <InputNumber suffix="Hz" step={0.05} className="gyre-fill-width" />
      </Form.Item>
      <Row gutter={12}>
        {COMPARED.map(({ name, other, which, extra }) => (
          <Col xs={24} sm={12} key={name}>
            <Form.Item
              name={name}
              label={`${which === 'first' ? 'First' : 'Second'} condition compared`}
              dependencies={[other]}
              rules={[pairRule(other, which)]}
              extra={extra}
            >
              <Input maxLength={200} />
            </Form.Item>
          </Col>
        ))}
      </Row>
    </>
  );
}

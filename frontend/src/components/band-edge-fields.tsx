import { Row } from 'antd';
import { checkWhenFilled } from '../lib/check-when-filled';
import { HalfRowNumberField } from './half-row-number-field';

/**
 * The low and high edge of a fixed alpha band (`bandLowHz`, `bandHighHz`), with the limits the
 * server checks: 1 to 40 Hz and at least 1 Hz wide (common practice).
 */
export function BandEdgeFields() {
  return (
    <Row gutter={12}>
      <HalfRowNumberField
        name="bandLowHz"
        label="Band low edge"
        suffix="Hz"
        step={0.5}
        rules={[
          { required: true, message: 'Enter the low edge in Hz.' },
          checkWhenFilled<number>((v) => (v < 1 ? 'The low edge must be at least 1 Hz.' : null)),
        ]}
      />
      <HalfRowNumberField
        name="bandHighHz"
        label="Band high edge"
        suffix="Hz"
        step={0.5}
        dependencies={['bandLowHz']}
        rules={[
          { required: true, message: 'Enter the high edge in Hz.' },
          checkWhenFilled<number>((v, get) => {
            if (v > 40) return 'The high edge must be at most 40 Hz.';
            const low = get('bandLowHz');
            return typeof low === 'number' && v - low < 1
              ? 'The band must be at least 1 Hz wide (high edge above the low edge).'
              : null;
          }),
        ]}
      />
    </Row>
  );
}

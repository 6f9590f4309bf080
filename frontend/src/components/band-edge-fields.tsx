import { Col, Form, InputNumber, Row, type FormRule } from 'antd';

/** A check of a number field that passes while it is empty (the `required` rule says so). */
function numberCheck(
  test: (value: number, get: (name: string) => unknown) => string | null,
): FormRule {
  return ({ getFieldValue }) => ({
    validator: async (_rule: unknown, value: number | null | undefined) => {
      if (value === null || value === undefined) return;
      const problem = test(value, getFieldValue as (name: string) => unknown);
      if (problem !== null) throw new Error(problem);
    },
  });
}

/**
 * The low and high edge of a fixed alpha band (`bandLowHz`, `bandHighHz`), with the limits the
 * server checks: 1 to 40 Hz and at least 1 Hz wide (common practice).
 */
export function BandEdgeFields() {
  return (
    <Row gutter={12}>
      <Col xs={24} sm={12}>
        <Form.Item
          name="bandLowHz"
          label="Band low edge"
          rules={[
            { required: true, message: 'Enter the low edge in Hz.' },
            numberCheck((v) => (v < 1 ? 'The low edge must be at least 1 Hz.' : null)),
          ]}
        >
          <InputNumber suffix="Hz" step={0.5} className="gyre-fill-width" />
        </Form.Item>
      </Col>
      <Col xs={24} sm={12}>
        <Form.Item
          name="bandHighHz"
          label="Band high edge"
          dependencies={['bandLowHz']}
          rules={[
            { required: true, message: 'Enter the high edge in Hz.' },
            numberCheck((v, get) => {
              if (v > 40) return 'The high edge must be at most 40 Hz.';
              const low = get('bandLowHz');
              return typeof low === 'number' && v - low < 1
                ? 'The band must be at least 1 Hz wide (high edge above the low edge).'
                : null;
            }),
          ]}
        >
          <InputNumber suffix="Hz" step={0.5} className="gyre-fill-width" />
        </Form.Item>
      </Col>
    </Row>
  );
}

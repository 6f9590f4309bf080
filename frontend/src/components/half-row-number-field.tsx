import { Col, Form, InputNumber, type FormRule } from 'antd';

/**
 * A labelled number input taking half a form row (the whole row on a narrow screen), for the
 * settings forms' paired fields (a band's edges, a window's start and end).
 */
export function HalfRowNumberField({
  name,
  label,
  rules,
  dependencies,
  suffix,
  step,
}: {
  name: string;
  label: string;
  rules: FormRule[];
  /** Fields whose change checks this one again. */
  dependencies?: string[];
  suffix?: string;
  step: number;
}) {
  return (
    <Col xs={24} sm={12}>
      <Form.Item name={name} label={label} dependencies={dependencies} rules={rules}>
        <InputNumber suffix={suffix} step={step} className="gyre-fill-width" />
      </Form.Item>
    </Col>
  );
}

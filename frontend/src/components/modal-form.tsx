import { Form, Modal, type FormInstance } from 'antd';
import type { ReactNode } from 'react';
import { useSubmission } from '../lib/use-submission';
import { FormError } from './form-error';

/**
 * A dialog holding one form: OK submits it and spins while `onSubmit` runs; a refusal shows the
 * server's words (else `failureText`) under the fields and keeps the dialog open. `onSubmit`
 * closes or resets what it must once saved; cancelling forgets the last failure.
 */
export function ModalForm<Values extends object>({
  open = true,
  form: givenForm,
  title,
  okText,
  danger,
  intro,
  failureText,
  initialValues,
  onSubmit,
  onClose,
  children,
}: {
  open?: boolean;
  /** The form's instance when the caller watches or resets fields; one is made otherwise. */
  form?: FormInstance<Values>;
  title: ReactNode;
  okText: string;
  danger?: boolean;
  /** Text above the fields. */
  intro?: ReactNode;
  failureText: string;
  initialValues?: Partial<Values>;
  onSubmit: (values: Values) => Promise<void>;
  onClose: () => void;
  children: ReactNode;
}) {
  const [form] = Form.useForm<Values>(givenForm);
  const { busy, error, run, clear } = useSubmission(failureText);
  return (
    <Modal
      open={open}
      title={title}
      okText={okText}
      okButtonProps={{ loading: busy, danger }}
      onOk={() => form.submit()}
      onCancel={() => {
        clear();
        onClose();
      }}
      destroyOnHidden
    >
      {intro}
      <Form<Values>
        form={form}
        layout="vertical"
        requiredMark={false}
        initialValues={initialValues}
        onFinish={(values) => run(() => onSubmit(values))}
      >
        {children}
        <FormError error={error} />
      </Form>
    </Modal>
  );
}

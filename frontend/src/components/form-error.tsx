import { Typography } from 'antd';

/**
 * A failed save's message under a form's fields, announced to screen readers. A file of its own:
 * sign-in uses it and must not load the dialog code (first-load budget).
 */
export function FormError({ error }: { error: string | null }) {
  if (error === null) return null;
  return (
    <Typography.Paragraph type="danger" role="alert">
      {error}
    </Typography.Paragraph>
  );
}

import { Flex, Typography } from 'antd';
import type { ReactNode } from 'react';

/** An import row's errors (red) then warnings (amber), one a line; `fallback` when it has none. */
export function ProblemLines({
  errors,
  warnings,
  fallback,
}: {
  errors: readonly string[];
  warnings: readonly string[];
  fallback: ReactNode;
}) {
  return (
    <Flex vertical gap={2}>
      {errors.map((text) => (
        <Typography.Text key={`e-${text}`} type="danger">
          {text}
        </Typography.Text>
      ))}
      {warnings.map((text) => (
        <Typography.Text key={`w-${text}`} type="warning">
          {text}
        </Typography.Text>
      ))}
      {errors.length + warnings.length === 0 && fallback}
    </Flex>
  );
}

import { Flex, Typography } from 'antd';

/** The title row of a screen: its name, one line on what it is for, and its actions. */
export function PageHeader({
  title,
  description,
  extra,
}: {
  title: string;
  description?: React.ReactNode;
  extra?: React.ReactNode;
}) {
  return (
    <Flex justify="space-between" align="flex-end" gap={16} wrap className="gyre-below-md">
      <div>
        <Typography.Title level={2} className="gyre-flush">
          {title}
        </Typography.Title>
        {description !== undefined && (
          <Typography.Text type="secondary">{description}</Typography.Text>
        )}
      </div>
      {extra !== undefined && <Flex gap={8}>{extra}</Flex>}
    </Flex>
  );
}

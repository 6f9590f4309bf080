import { App, Button, Card, Popconfirm, Space, Table, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState, type ReactNode } from 'react';
import { EmptyState, ReadError } from '../../../components/page-states';
import { ApiError } from '../../../lib/api-client';
import '../study-settings.css';

interface Named {
  id: string;
  name: string;
}

/**
 * A study's list that admins add to, change and delete from (the visit schedule, the groups):
 * a card with its table, an add button, Change and Delete on each row, and the item's form in a
 * dialog. Others read the table only.
 */
export function EditableListSection<Item extends Named, Input>({
  title,
  addText,
  intro,
  tableLabel,
  list,
  loadErrorTitle,
  emptyText,
  columns,
  canManage,
  deleteDescription,
  deletedText,
  deleteFailureText,
  onDelete,
  onSave,
  renderForm,
}: {
  /** The card's title and its region's name. */
  title: string;
  addText: string;
  intro?: ReactNode;
  tableLabel: string;
  list: { data?: Item[]; error?: unknown; mutate: () => Promise<unknown> };
  loadErrorTitle: string;
  emptyText: string;
  columns: TableColumnsType<Item>;
  canManage: boolean;
  /** Under "Delete NAME?": which items can be deleted. */
  deleteDescription: string;
  deletedText: (item: Item) => string;
  deleteFailureText: string;
  onDelete: (id: string) => Promise<void>;
  onSave: (id: string | null, input: Input) => Promise<Item>;
  renderForm: (props: {
    item: Item | null;
    onClose: () => void;
    onSave: (input: Input) => Promise<void>;
  }) => ReactNode;
}) {
  const { message } = App.useApp();
  const [editing, setEditing] = useState<Item | 'new' | null>(null);

  const remove = async (item: Item) => {
    try {
      await onDelete(item.id);
      message.success(deletedText(item));
    } catch (caught) {
      message.error(caught instanceof ApiError ? caught.message : deleteFailureText);
    }
  };

  const actions: TableColumnsType<Item> = [
    {
      key: 'actions',
      title: 'Actions',
      render: (_: unknown, item: Item) => (
        <Space size={4} wrap>
          <Button size="small" onClick={() => setEditing(item)} aria-label={`Change ${item.name}`}>
            Change
          </Button>
          <Popconfirm
            title={`Delete ${item.name}?`}
            description={deleteDescription}
            okText="Delete"
            // `remove` shows its own outcome (a message), so nothing waits for it.
            onConfirm={() => void remove(item)}
          >
            <Button size="small" danger aria-label={`Delete ${item.name}`}>
              Delete
            </Button>
          </Popconfirm>
        </Space>
      ),
    },
  ];

  return (
    <Card
      title={title}
      role="region"
      aria-label={title}
      extra={
        canManage && (
          <Button type="primary" onClick={() => setEditing('new')}>
            {addText}
          </Button>
        )
      }
    >
      {intro !== undefined && <Typography.Paragraph type="secondary">{intro}</Typography.Paragraph>}
      {list.error !== undefined ? (
        <ReadError read={list} title={loadErrorTitle} />
      ) : list.data !== undefined && list.data.length === 0 ? (
        <EmptyState description={emptyText} />
      ) : (
        <Table<Item>
          aria-label={tableLabel}
          rowKey="id"
          size="middle"
          pagination={false}
          loading={list.data === undefined}
          dataSource={list.data ?? []}
          className="gyre-wrapping-table"
          columns={canManage ? [...columns, ...actions] : columns}
        />
      )}
      {canManage &&
        editing !== null &&
        renderForm({
          item: editing === 'new' ? null : editing,
          onClose: () => setEditing(null),
          onSave: async (input) => {
            const saved = await onSave(editing === 'new' ? null : editing.id, input);
            message.success(`${saved.name} saved.`);
            setEditing(null);
          },
        })}
    </Card>
  );
}

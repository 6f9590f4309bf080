import type { StudyGroupView } from '@gyre/shared';
import { App, Button, Card, Form, Input, Modal, Popconfirm, Space, Table, Typography } from 'antd';
import { useState } from 'react';
import { EmptyState, ErrorState } from '../../../components/page-states';
import { ApiError } from '../../../lib/api-client';
import { useGroups, useScheduleWrites, type GroupInput } from '../api/study-schedule';

/** The study's groups or arms: admins add, rename and delete them (not while in use). */
export function GroupsSection({ studyId, canManage }: { studyId: string; canManage: boolean }) {
  const groups = useGroups(studyId);
  const writes = useScheduleWrites(studyId);
  const { message } = App.useApp();
  const [editing, setEditing] = useState<StudyGroupView | 'new' | null>(null);

  const remove = async (group: StudyGroupView) => {
    try {
      await writes.deleteGroup(group.id);
      message.success(`${group.name} deleted.`);
    } catch (caught) {
      message.error(
        caught instanceof ApiError ? caught.message : 'The group could not be deleted.',
      );
    }
  };

  return (
    <Card
      title="Groups"
      role="region"
      aria-label="Groups"
      extra={
        canManage && (
          <Button type="primary" onClick={() => setEditing('new')}>
            Add group
          </Button>
        )
      }
    >
      {groups.error !== undefined ? (
        <ErrorState
          title="The groups could not be loaded"
          error={groups.error}
          onRetry={() => void groups.mutate()}
        />
      ) : groups.data !== undefined && groups.data.length === 0 ? (
        <EmptyState description="The study has no groups or arms." />
      ) : (
        <Table<StudyGroupView>
          aria-label="Study groups"
          rowKey="id"
          size="middle"
          pagination={false}
          loading={groups.data === undefined}
          dataSource={groups.data ?? []}
          scroll={{ x: 'max-content' }}
          columns={[
            { key: 'name', title: 'Group', render: (_, g) => g.name },
            {
              key: 'description',
              title: 'Description',
              responsive: ['md'],
              render: (_, g) => g.description || '—',
            },
            ...(canManage
              ? [
                  {
                    key: 'actions',
                    title: 'Actions',
                    render: (_: unknown, g: StudyGroupView) => (
                      <Space size={4} wrap>
                        <Button
                          size="small"
                          onClick={() => setEditing(g)}
                          aria-label={`Change ${g.name}`}
                        >
                          Change
                        </Button>
                        <Popconfirm
                          title={`Delete ${g.name}?`}
                          description="Only a group no participant belongs to can be deleted."
                          okText="Delete"
                          onConfirm={() => remove(g)}
                        >
                          <Button size="small" danger aria-label={`Delete ${g.name}`}>
                            Delete
                          </Button>
                        </Popconfirm>
                      </Space>
                    ),
                  },
                ]
              : []),
          ]}
        />
      )}
      {canManage && editing !== null && (
        <GroupForm
          group={editing === 'new' ? null : editing}
          onClose={() => setEditing(null)}
          onSave={async (input) => {
            const saved = await writes.saveGroup(editing === 'new' ? null : editing.id, input);
            message.success(`${saved.name} saved.`);
            setEditing(null);
          }}
        />
      )}
    </Card>
  );
}

function GroupForm({
  group,
  onClose,
  onSave,
}: {
  group: StudyGroupView | null;
  onClose: () => void;
  onSave: (input: GroupInput) => Promise<void>;
}) {
  const [form] = Form.useForm<GroupInput>();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (values: GroupInput) => {
    setBusy(true);
    setError(null);
    try {
      await onSave({ name: values.name.trim(), description: (values.description ?? '').trim() });
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The group could not be saved.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Modal
      open
      title={group === null ? 'New group' : `Change ${group.name}`}
      okText="Save group"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<GroupInput>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
        initialValues={group ?? { description: '' }}
      >
        <Form.Item
          label="Name"
          name="name"
          rules={[
            { required: true, whitespace: true, message: 'Give the group a name.' },
            { max: 60, message: 'A name has at most 60 characters.' },
          ]}
        >
          <Input autoFocus />
        </Form.Item>
        <Form.Item label="Description" name="description" rules={[{ max: 2000 }]}>
          <Input.TextArea autoSize={{ minRows: 2 }} />
        </Form.Item>
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
      </Form>
    </Modal>
  );
}

import type { StudyGroupView } from '@gyre/shared';
import { Form, Input } from 'antd';
import { ModalForm } from '../../../components/modal-form';
import { useGroups } from '../../../lib/study-schedule';
import { useScheduleWrites, type GroupInput } from '../api/study-schedule';
import { EditableListSection } from './editable-list-section';

/** The study's groups or arms: admins add, rename and delete them (not while in use). */
export function GroupsSection({ studyId, canManage }: { studyId: string; canManage: boolean }) {
  const writes = useScheduleWrites(studyId);
  return (
    <EditableListSection<StudyGroupView, GroupInput>
      title="Groups"
      addText="Add group"
      tableLabel="Study groups"
      list={useGroups(studyId)}
      loadErrorTitle="The groups could not be loaded"
      emptyText="The study has no groups or arms."
      columns={[
        { key: 'name', title: 'Group', render: (_, g) => g.name },
        {
          key: 'description',
          title: 'Description',
          responsive: ['md'],
          render: (_, g) => g.description || '—',
        },
      ]}
      canManage={canManage}
      deleteDescription="Only a group no participant belongs to can be deleted."
      deletedText={(g) => `${g.name} deleted.`}
      deleteFailureText="The group could not be deleted."
      onDelete={writes.deleteGroup}
      onSave={writes.saveGroup}
      renderForm={({ item, onClose, onSave }) => (
        <GroupForm group={item} onClose={onClose} onSave={onSave} />
      )}
    />
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
  return (
    <ModalForm<GroupInput>
      title={group === null ? 'New group' : `Change ${group.name}`}
      okText="Save group"
      failureText="The group could not be saved."
      initialValues={group ?? { description: '' }}
      onSubmit={(values) =>
        onSave({ name: values.name.trim(), description: (values.description ?? '').trim() })
      }
      onClose={onClose}
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
    </ModalForm>
  );
}

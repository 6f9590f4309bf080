import { membershipOf, ROLES, type Role } from '@gyre/shared';
import { Form, Select } from 'antd';
import { useSites } from '../api/sites';
import { useStudies } from '../api/studies';
import { ROLE_DUTIES, ROLE_LABELS } from './role-labels';

export interface MembershipValues {
  role: Role;
  studyId?: string;
  siteId?: string;
}

/**
 * Role, then study and site as the role needs them: technicians and coordinators belong to one
 * site, analysts and monitors to one study, administrators to neither.
 */
export function MembershipFields() {
  const form = Form.useFormInstance<MembershipValues>();
  const role = Form.useWatch('role', form);
  const studyId = Form.useWatch('studyId', form);
  const studies = useStudies();
  const sites = useSites();
  const membership = role === undefined ? null : membershipOf(role);
  const studySites = (sites.data?.items ?? []).filter((site) => site.studyId === studyId);

  return (
    <>
      <Form.Item
        label="Role"
        name="role"
        extra={role !== undefined ? ROLE_DUTIES[role] : undefined}
        rules={[{ required: true, message: 'Choose a role.' }]}
      >
        <Select
          placeholder="Choose a role"
          options={ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }))}
          onChange={(next: Role) => {
            if (membershipOf(next) === 'installation')
              form.setFieldsValue({ studyId: undefined, siteId: undefined });
            if (membershipOf(next) === 'study') form.setFieldsValue({ siteId: undefined });
          }}
        />
      </Form.Item>
      {membership !== null && membership !== 'installation' && (
        <Form.Item
          label="Study"
          name="studyId"
          rules={[{ required: true, message: 'Choose the study.' }]}
        >
          <Select
            placeholder="Choose the study"
            loading={studies.isLoading}
            options={(studies.data?.items ?? []).map((study) => ({
              value: study.id,
              label: `${study.code} · ${study.name}`,
            }))}
            onChange={() => form.setFieldsValue({ siteId: undefined })}
            notFoundContent={
              studies.error !== undefined ? 'The studies could not be loaded' : 'No studies yet'
            }
          />
        </Form.Item>
      )}
      {membership === 'site' && (
        <Form.Item
          label="Site"
          name="siteId"
          rules={[{ required: true, message: `A ${role ?? ''} belongs to one site: choose it.` }]}
        >
          <Select
            placeholder={studyId === undefined ? 'Choose the study first' : 'Choose the site'}
            disabled={studyId === undefined}
            loading={sites.isLoading}
            options={studySites.map((site) => ({
              value: site.id,
              label: `${site.code} · ${site.name}`,
            }))}
            notFoundContent="This study has no sites yet"
          />
        </Form.Item>
      )}
    </>
  );
}

/** The membership part of a request body: only the ids the role uses. */
export function membershipBody(values: MembershipValues): {
  role: Role;
  studyId: string | null;
  siteId: string | null;
} {
  const membership = membershipOf(values.role);
  return {
    role: values.role,
    studyId: membership === 'installation' ? null : (values.studyId ?? null),
    siteId: membership === 'site' ? (values.siteId ?? null) : null,
  };
}

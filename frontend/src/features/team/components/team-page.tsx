import { ROLES, type Role, type UserState, type UserView } from '@gyre/shared';
import { App, Button, Card, Flex, Segmented, Select, Space, Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { useState } from 'react';
import { PageHeader } from '../../../components/page-header';
import { SearchInput } from '../../../components/search-input';
import { ApiError } from '../../../lib/api-client';
import { useAppAbility } from '../../../lib/session/ability';
import { useSession } from '../../../lib/session/session-context';
import { useResendInvitation } from '../api/resend-invitation';
import { useSites } from '../api/sites';
import { useStudies } from '../api/studies';
import { useUsers, type UserFilters } from '../api/users';
import { AccountStateForm } from './account-state-form';
import { EditUserForm } from './edit-user-form';
import { InviteUserForm } from './invite-user-form';
import { ROLE_LABELS } from './role-labels';
import { WorkerTokensSection } from './worker-tokens-section';
import { GYRE_COLORS } from '../../../app/theme';
import { PagedTable } from '../../../components/paged-table';
import { usePagedList } from '../../../components/use-paged-list';
import {
  dateTimeColumn,
  stateFilterOptions,
  stateTagColumn,
  type StateLook,
} from '../../../components/table-columns';

const STATE_LOOK: Record<UserState, StateLook> = {
  active: { label: 'Active', color: 'success' },
  invited: { label: 'Invited', color: GYRE_COLORS.amberText },
  deactivated: { label: 'Deactivated', color: 'default' },
};

const PAGE_SIZE = 20;

type Dialog =
  | { kind: 'invite' }
  | { kind: 'edit'; user: UserView }
  | { kind: 'state'; user: UserView; target: 'active' | 'deactivated' }
  | null;

/** Team (admin): accounts, their role and site, invitations and deactivation; worker tokens. */
export function TeamPage() {
  const { me } = useSession();
  const ability = useAppAbility();
  const { message } = App.useApp();
  const list = usePagedList<UserFilters>(PAGE_SIZE, {});
  const filters = list.filter;
  const users = useUsers(filters, list.page, PAGE_SIZE);
  const studies = useStudies();
  const sites = useSites();
  const resend = useResendInvitation();
  const [dialog, setDialog] = useState<Dialog>(null);

  const studyCode = (id: string | null) =>
    id === null ? null : (studies.data?.items.find((s) => s.id === id)?.code ?? id.slice(0, 8));
  const siteName = (id: string | null) =>
    id === null ? null : (sites.data?.items.find((s) => s.id === id)?.name ?? id.slice(0, 8));

  const filter = (change: Partial<UserFilters>) =>
    list.setFilter((current) => ({ ...current, ...change }));

  const columns: TableColumnsType<UserView> = [
    {
      title: 'Name',
      dataIndex: 'name',
      render: (name: string, user) => (
        <>
          <Typography.Text strong>{name}</Typography.Text>
          <br />
          <Typography.Text type="secondary">{user.email}</Typography.Text>
        </>
      ),
    },
    { title: 'Role', dataIndex: 'role', width: 130, render: (role: Role) => ROLE_LABELS[role] },
    {
      title: 'Study · site',
      key: 'membership',
      width: 210,
      render: (_, user) =>
        user.studyId === null ? (
          <Typography.Text type="secondary">Whole installation</Typography.Text>
        ) : (
          [studyCode(user.studyId), siteName(user.siteId)].filter(Boolean).join(' · ')
        ),
    },
    stateTagColumn(STATE_LOOK, 120),
    dateTimeColumn('Last sign-in', 'lastSignInAt', 190),
    {
      title: '',
      key: 'actions',
      width: 300,
      render: (_, user) => {
        const self = user.id === me.user.id;
        return (
          <Space size={4} wrap>
            <Button size="small" onClick={() => setDialog({ kind: 'edit', user })} disabled={self}>
              Role and site
            </Button>
            {user.state === 'invited' && (
              <Button
                size="small"
                onClick={() =>
                  void resend(user.id).then(
                    () => message.success(`A new invitation is on its way to ${user.email}.`),
                    (caught: unknown) =>
                      message.error(
                        caught instanceof ApiError
                          ? caught.message
                          : 'The invitation could not be sent.',
                      ),
                  )
                }
              >
                Send again
              </Button>
            )}
            {user.state === 'active' && !self && (
              <Button
                size="small"
                danger
                onClick={() => setDialog({ kind: 'state', user, target: 'deactivated' })}
              >
                Deactivate
              </Button>
            )}
            {user.state === 'deactivated' && (
              <Button
                size="small"
                onClick={() => setDialog({ kind: 'state', user, target: 'active' })}
              >
                Reactivate
              </Button>
            )}
          </Space>
        );
      },
    },
  ];

  return (
    <>
      <PageHeader
        title="Team"
        description="Who works in Gyre, in which role and where. Invitations go out by e-mail."
        extra={
          <Button type="primary" onClick={() => setDialog({ kind: 'invite' })}>
            Invite someone
          </Button>
        }
      />
      <Card>
        <Flex gap={16} wrap className="gyre-below">
          <SearchInput
            allowClear
            placeholder="Name or e-mail"
            aria-label="Search by name or e-mail"
            searchLabel="Search accounts"
            style={{ width: 260, maxWidth: '100%' }}
            onSearch={(q) => filter({ q: q.trim() || undefined })}
          />
          <Select
            allowClear
            placeholder="Any role"
            aria-label="Role"
            style={{ width: 180, maxWidth: '100%' }}
            value={filters.role}
            onChange={(role: Role | undefined) => filter({ role })}
            options={ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }))}
          />
          <Segmented<UserState | 'all'>
            value={filters.state ?? 'all'}
            onChange={(state) => filter({ state: state === 'all' ? undefined : state })}
            aria-label="Account state"
            options={stateFilterOptions(STATE_LOOK)}
          />
        </Flex>
        <PagedTable<UserView>
          query={users}
          loadErrorTitle="The accounts could not be loaded"
          emptyText="No account matches."
          columns={columns}
          {...list.paging}
        />
      </Card>
      {ability.can('manage', 'WorkerToken') && <WorkerTokensSection />}
      <InviteUserForm
        open={dialog?.kind === 'invite'}
        onClose={() => setDialog(null)}
        onInvited={(user) => {
          setDialog(null);
          message.success(`${user.email} is invited; the e-mail is on its way.`);
        }}
      />
      {dialog?.kind === 'edit' && (
        <EditUserForm user={dialog.user} onClose={() => setDialog(null)} />
      )}
      {dialog?.kind === 'state' && (
        <AccountStateForm
          user={dialog.user}
          target={dialog.target}
          onClose={() => setDialog(null)}
        />
      )}
    </>
  );
}

import type {
  AppRule,
  CreatedWorkerTokenView,
  MeResponse,
  Page,
  WorkerTokenView,
} from '@gyre/shared';
import { packRules } from '@casl/ability/extra';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, SITE, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { errorResponse } from '../../../test/error-response';

installMswServer();

const page = <T,>(items: T[]): Page<T> => ({ items, total: items.length, page: 1, pageSize: 10 });

// Generated test data.
const LOCAL: WorkerTokenView = {
  id: 'wt-local',
  name: 'local worker',
  local: true,
  createdAt: '2025-01-06T09:00:00.000Z',
  createdById: null,
  createdByName: null,
  lastUsedAt: '2025-01-06T09:05:00.000Z',
  revokedAt: null,
  revokedById: null,
  revokedByName: null,
  revokedReason: null,
};
const NODE: WorkerTokenView = {
  ...LOCAL,
  id: 'wt-node',
  name: 'compute node 2',
  local: false,
  createdById: 'user-admin',
  createdByName: 'Adam Min',
  lastUsedAt: null,
};
const SECRET =
  'gyre_wt_0f6c2c1e-9d0b-4c55-8a59-3b8f3f0c1d2e.Q2hvb3NlIGFuIGludmVudGVkIHNlY3JldCBoZXJlIQx';

function teamHandlers(tokens: WorkerTokenView[]) {
  const requested: string[] = [];
  server.use(
    http.get('/api/users', () => HttpResponse.json(page([]))),
    http.get('/api/studies', () => HttpResponse.json(page([STUDY]))),
    http.get('/api/sites', () => HttpResponse.json(page([SITE]))),
    http.get('/api/worker-tokens', ({ request }) => {
      requested.push(new URL(request.url).search);
      return HttpResponse.json(page(tokens));
    }),
  );
  return requested;
}

const section = () => screen.findByRole('region', { name: 'Worker tokens' });

describe('Team: worker tokens', () => {
  it('lists live tokens with who made them and when they were last used', async () => {
    const requested = teamHandlers([NODE, LOCAL]);
    renderApp('/team', meFor('admin'));
    const card = await section();
    const nodeRow = (await within(card).findByText('compute node 2')).closest('tr') as HTMLElement;
    expect(within(nodeRow).getByText('by Adam Min')).toBeInTheDocument();
    expect(within(nodeRow).getByText('Never')).toBeInTheDocument();
    expect(within(nodeRow).getByRole('button', { name: 'Revoke' })).toBeInTheDocument();
    const localRow = within(card).getByText('local worker').closest('tr') as HTMLElement;
    expect(within(localRow).getByText('This server')).toBeInTheDocument();
    expect(within(localRow).getByText('by Gyre at start')).toBeInTheDocument();
    expect(requested[0]).toContain('state=live');
  });

  it('shows the new secret once, with a copy button and a warning, then never again', async () => {
    let sent: unknown = null;
    teamHandlers([LOCAL]);
    server.use(
      http.post('/api/worker-tokens', async ({ request }) => {
        sent = await request.json();
        const created: CreatedWorkerTokenView = { ...NODE, secret: SECRET };
        return HttpResponse.json(created, { status: 201 });
      }),
    );
    renderApp('/team', meFor('admin'));
    const card = await section();
    await userEvent.click(within(card).getByRole('button', { name: 'Create a worker token' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Create the token' }));
    expect(await within(dialog).findByText('Name the token.')).toBeInTheDocument();
    expect(sent).toBeNull();
    await userEvent.type(within(dialog).getByLabelText('Name'), ' node 2 ');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Create the token' }));
    await waitFor(() => expect(sent).toEqual({ name: 'node 2' }));
    const shown = await screen.findByRole('dialog');
    expect(within(shown).getByText(SECRET)).toBeInTheDocument();
    expect(within(shown).getByText(/will not be shown again/)).toBeInTheDocument();
    expect(within(shown).getByRole('button', { name: /copy/i })).toBeInTheDocument();
    await userEvent.click(within(shown).getByRole('button', { name: 'I have copied it' }));
    await waitFor(() => expect(screen.queryByText(SECRET)).not.toBeInTheDocument());
  });

  it('says why a name is refused', async () => {
    teamHandlers([LOCAL]);
    server.use(
      http.post('/api/worker-tokens', () =>
        errorResponse(
          409,
          'WORKER_TOKEN_NAME_RESERVED',
          `name: "local worker" is the server's own token; choose another name`,
        ),
      ),
    );
    renderApp('/team', meFor('admin'));
    const card = await section();
    await userEvent.click(within(card).getByRole('button', { name: 'Create a worker token' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.type(within(dialog).getByLabelText('Name'), 'local worker');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Create the token' }));
    expect(await within(dialog).findByRole('alert')).toHaveTextContent("is the server's own token");
  });

  it('revokes only after confirmation, with the optional reason', async () => {
    let revoked: { id: string; body: unknown } | null = null;
    teamHandlers([NODE]);
    server.use(
      http.post('/api/worker-tokens/:id/revoke', async ({ params, request }) => {
        revoked = { id: params.id as string, body: await request.json() };
        return HttpResponse.json({ ...NODE, revokedAt: '2025-01-07T10:00:00.000Z' });
      }),
    );
    renderApp('/team', meFor('admin'));
    const card = await section();
    const row = (await within(card).findByText('compute node 2')).closest('tr') as HTMLElement;
    await userEvent.click(within(row).getByRole('button', { name: 'Revoke' }));
    const dialog = await screen.findByRole('dialog');
    expect(within(dialog).getByText(/refused from their next request/)).toBeInTheDocument();
    await userEvent.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(revoked).toBeNull();
    await userEvent.click(within(row).getByRole('button', { name: 'Revoke' }));
    const again = await screen.findByRole('dialog');
    await userEvent.type(within(again).getByLabelText('Reason (optional)'), 'machine retired');
    await userEvent.click(within(again).getByRole('button', { name: 'Revoke' }));
    await waitFor(() =>
      expect(revoked).toEqual({ id: 'wt-node', body: { reason: 'machine retired' } }),
    );
  });

  it('is not shown, nor asked for, when the rules do not allow managing worker tokens', async () => {
    const requested = teamHandlers([NODE]);
    const admin = meFor('admin');
    // An account that may manage users but not worker tokens (no such role today).
    const me: MeResponse = {
      ...admin,
      rules: packRules<AppRule>([{ action: 'manage', subject: ['Study', 'Site', 'User'] }]),
    };
    renderApp('/team', me);
    expect(await screen.findByRole('button', { name: 'Invite someone' })).toBeInTheDocument();
    expect(screen.queryByText('Worker tokens')).not.toBeInTheDocument();
    expect(requested).toEqual([]);
  });
});

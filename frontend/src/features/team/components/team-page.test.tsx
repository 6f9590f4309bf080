import type { Page, UserView } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, SITE, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';

installMswServer();

const page = <T,>(items: T[]): Page<T> => ({ items, total: items.length, page: 1, pageSize: 200 });
// Generated test data.
const technician: UserView = { ...meFor('technician').user, id: 'u-t', name: 'Tomas Tech' };

function handlers(onInvite?: (body: unknown) => void) {
  server.use(
    http.get('/api/users', () => HttpResponse.json(page([technician]))),
    http.get('/api/studies', () => HttpResponse.json(page([STUDY]))),
    http.get('/api/sites', () => HttpResponse.json(page([SITE]))),
    http.get('/api/worker-tokens', () => HttpResponse.json(page([]))),
    http.post('/api/users/invitations', async ({ request }) => {
      const body = await request.json();
      onInvite?.(body);
      return HttpResponse.json({ ...technician, id: 'u-new', state: 'invited' }, { status: 201 });
    }),
  );
}

async function choose(dialog: HTMLElement, label: string, option: string) {
  await userEvent.click(within(dialog).getByLabelText(label));
  const options = await screen.findAllByTitle(option);
  await userEvent.click(options[options.length - 1]);
}

describe('Team', () => {
  it('lists accounts with role, study and site', async () => {
    handlers();
    renderApp('/team', meFor('admin'));
    const row = (await screen.findByText('technician@example.org')).closest('tr') as HTMLElement;
    expect(within(row).getByText('Technician')).toBeInTheDocument();
    expect(await within(row).findByText('ALPHA-AGE · North clinic')).toBeInTheDocument();
    expect(within(row).getByRole('button', { name: 'Deactivate' })).toBeInTheDocument();
  });

  it('asks for a site when inviting a technician, then sends the invitation', async () => {
    let sent: unknown = null;
    handlers((body) => (sent = body));
    renderApp('/team', meFor('admin'));
    await userEvent.click(await screen.findByRole('button', { name: 'Invite someone' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.type(within(dialog).getByLabelText('E-mail'), 'new.tech@example.org');
    await userEvent.type(within(dialog).getByLabelText('Name'), 'Nora New');
    await choose(dialog, 'Role', 'Technician');
    await choose(dialog, 'Study', 'ALPHA-AGE · Alpha in ageing');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Send invitation' }));
    expect(
      await within(dialog).findByText('A technician belongs to one site: choose it.'),
    ).toBeInTheDocument();
    expect(sent).toBeNull();
    await choose(dialog, 'Site', 'NORTH · North clinic');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Send invitation' }));
    await waitFor(() =>
      expect(sent).toEqual({
        email: 'new.tech@example.org',
        name: 'Nora New',
        role: 'technician',
        studyId: STUDY.id,
        siteId: SITE.id,
      }),
    );
  });

  it('needs a reason to deactivate an account', async () => {
    let change: unknown = null;
    handlers();
    server.use(
      http.patch('/api/users/u-t', async ({ request }) => {
        change = await request.json();
        return HttpResponse.json({ ...technician, state: 'deactivated' });
      }),
    );
    renderApp('/team', meFor('admin'));
    await userEvent.click(await screen.findByRole('button', { name: 'Deactivate' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Deactivate' }));
    expect(await within(dialog).findByText('Give the reason.')).toBeInTheDocument();
    await userEvent.type(within(dialog).getByLabelText('Reason'), 'Left the study team');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Deactivate' }));
    await waitFor(() =>
      expect(change).toEqual({ state: 'deactivated', reason: 'Left the study team' }),
    );
  });
});

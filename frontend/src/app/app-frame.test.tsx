import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { beforeEach, describe, expect, it } from 'vitest';
import { reviewWorklist } from '../features/home/testing/worklist-fixtures';
import { meFor } from '../test/fixtures';
import { installMswServer, server } from '../test/msw-server';
import { renderApp } from '../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../test/viewport';

installMswServer();

beforeEach(() => {
  server.use(http.get('/api/worklist', () => HttpResponse.json(reviewWorklist(false))));
});

describe('the app frame', () => {
  it('offers "Skip to main content" as the first stop of Tab, and it focuses the main landmark', async () => {
    const user = userEvent.setup();
    renderApp('/', meFor('monitor'));
    await screen.findByText(`Welcome, ${meFor('monitor').user.name}`);
    expect(screen.getByRole('banner')).toBeInTheDocument();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeInTheDocument();
    const main = screen.getByRole('main');
    await user.tab();
    const skip = screen.getByRole('link', { name: 'Skip to main content' });
    expect(skip).toHaveFocus();
    await user.keyboard('{Enter}');
    expect(main).toHaveFocus();
  });

  it('at phone width puts the menu behind a named button that opens it in a drawer', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    const user = userEvent.setup();
    renderApp('/', meFor('monitor'));
    await screen.findByText(`Welcome, ${meFor('monitor').user.name}`);
    // No squeezed horizontal menu on a phone: the navigation is not on the page until opened.
    expect(screen.queryByRole('navigation', { name: 'Main' })).toBeNull();
    const opener = screen.getByRole('button', { name: 'Open the menu' });
    expect(opener).toHaveAttribute('aria-expanded', 'false');
    await user.click(opener);
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    const labels = within(nav)
      .getAllByRole('menuitem')
      .map((item) => item.textContent);
    expect(labels).toEqual(expect.arrayContaining(['Participants', 'Ledger']));
    expect(opener).toHaveAttribute('aria-expanded', 'true');
    // The role moves beside the place on a phone; the name is still there, whole in the DOM.
    expect(screen.getAllByText(meFor('monitor').user.name).length).toBeGreaterThan(0);
  });
});

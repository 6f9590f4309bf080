import AxeBuilder from '@axe-core/playwright';
import type { Locator, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { openBrowser, screenshot, userGuideImage } from './support/browser';
import { startGyre, type RunningGyre } from './support/gyre-server';
import { sticksOutSideways } from './support/page-width';
import { signInThroughPage } from './support/sign-in-page';
import { setUpInventedStudy, type InventedStudy } from './support/study-data';

/**
 * Every screen of every role at a phone's width (390 px) and a desktop's (1440 px): the page
 * never scrolls sideways, and axe-core finds nothing serious or critical under WCAG 2.0/2.1
 * A and AA. Plus the keyboard: the skip link comes first, the phone menu opens, the
 * Participants site filter opens without a mouse.
 */

// Generated test accounts of an invented study. The analyst's long name checks the ellipsis.
const PEOPLE: InventedStudy['people'] = {
  admin: { email: 'ines.admin@gyre.test', name: 'Ines Admin' },
  technician: { email: 'tomas.tech@gyre.test', name: 'Tomas Tech' },
  analyst: {
    email: 'annemarie.analyst@gyre.test',
    name: 'Annemarie Vandenberghe-Oosterhuis',
  },
  monitor: { email: 'mina.monitor@gyre.test', name: 'Mina Monitor' },
  coordinator: { email: 'carl.coord@gyre.test', name: 'Carl Coordinator' },
};

/** The axe-core rule sets of WCAG 2.0 and 2.1, levels A and AA (axe-core's tag names). */
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
/** Per role: a fresh load, a wait, a width check and axe for each screen twice, on a busy machine. */
const SCREENS_TIMEOUT_MS = 480_000;
const WIDTHS = [
  { width: 1440, height: 900 },
  { width: 390, height: 844 },
] as const;

/**
 * The user guide's pictures (docs/user-guide.md, one section per role): a few screens per role
 * at the desktop width, from this test's invented study, as `<role>-<screen>.png`.
 */
const USER_GUIDE_SCREENS: Readonly<Record<string, readonly string[]>> = {
  technician: ['Intake'],
  analyst: ['Review', 'Participant trajectory', 'Study overview'],
  monitor: ['Ledger'],
  coordinator: ['Signed report revisions'],
  admin: ['Team'],
};

/** The window of the user guide's pictures: a laptop's desktop width. */
const USER_GUIDE_SIZE = { width: 1280, height: 800 } as const;

const fileName = (text: string) => text.toLowerCase().replace(/\W+/g, '-');

interface Screen {
  name: string;
  path: () => string;
  /** An element of this screen itself, shown once its data is in (lazy routes keep the old one). */
  ready: (page: Page) => Locator;
}

describe('layout and accessibility of every screen, on a real server', () => {
  let gyre: RunningGyre;
  let data: InventedStudy;
  const browsers: Awaited<ReturnType<typeof openBrowser>>[] = [];

  async function newPage(): Promise<Page> {
    const browser = await openBrowser();
    browsers.push(browser);
    return browser.context.newPage();
  }

  const heading = (name: string | RegExp) => (page: Page) =>
    page.getByRole('heading', { name, exact: typeof name === 'string' ? true : undefined });
  /** A table row of the study's participant. */
  const participantRow = (page: Page) =>
    page.getByRole('row').filter({ hasText: data.participant.code });
  const siteQuality = (page: Page) => page.locator('[aria-label="Site quality"]');

  const screens = {
    signIn: {
      name: 'Sign-in',
      path: () => '/sign-in',
      ready: (page) => page.getByRole('button', { name: 'Sign in' }),
    },
    forgot: {
      name: 'Forgot password',
      path: () => '/forgot-password',
      ready: (page) => page.getByRole('button', { name: 'Send the link' }),
    },
    home: { name: 'Home', path: () => '/', ready: heading(/^Welcome, /) },
    intake: {
      name: 'Intake',
      path: () => `/intake?participant=${data.participant.id}&visit=${data.visit.id}`,
      ready: (page) =>
        page.getByText(`Upload recordings for ${data.participant.code}, ${data.visit.label}`),
    },
    review: {
      name: 'Review',
      path: () => `/review/${data.visit.id}`,
      ready: (page) => page.getByTestId('roi-delta-f'),
    },
    participants: {
      name: 'Participants',
      path: () => '/participants',
      ready: (page) => page.getByRole('link', { name: data.participant.code }),
    },
    participant: {
      name: 'Participant trajectory',
      path: () => `/participants/${data.participant.id}`,
      ready: (page) => page.getByRole('table', { name: 'Visits' }),
    },
    ledger: {
      name: 'Ledger',
      path: () => '/ledger',
      ready: (page) => page.getByText('The trail is intact'),
    },
    reports: {
      name: 'Reports',
      path: () => '/reports',
      ready: participantRow,
    },
    signedReports: {
      name: 'Signed report revisions',
      path: () => '/reports/revisions',
      ready: participantRow,
    },
    team: {
      name: 'Team',
      path: () => '/team',
      ready: (page) => page.getByText(PEOPLE.monitor.email),
    },
    outbox: {
      name: 'Outbox',
      path: () => '/outbox',
      ready: (page) => page.getByText('You are invited to Gyre'),
    },
    studySettings: {
      name: 'Study settings',
      path: () => '/study-settings',
      ready: (page) => page.locator('[aria-label="Versions"]'),
    },
    studySetup: {
      name: 'Study set-up',
      path: () => `/study-setup?study=${data.study.id}`,
      ready: (page) =>
        page.getByRole('region', { name: 'Visit schedule' }).getByRole('row', { name: /Baseline/ }),
    },
    overview: {
      name: 'Study overview',
      path: () => '/study-overview',
      ready: siteQuality,
    },
    adminOverview: {
      name: 'Study overview',
      path: () => `/study-overview?study=${data.study.id}`,
      ready: siteQuality,
    },
    notFound: {
      name: 'Not found',
      path: () => '/no/such/screen',
      ready: (page) => page.getByText('No such page'),
    },
  } satisfies Record<string, Screen>;

  /** What the page has no business showing once a screen is ready: skeletons and spinners. */
  async function settle(page: Page): Promise<void> {
    await page
      .waitForFunction(
        () =>
          document.querySelectorAll('.ant-skeleton-active, .ant-spin-spinning').length === 0 &&
          document.querySelector('.gyre-route-progress') === null,
        undefined,
        { timeout: 15_000, polling: 200 },
      )
      .catch(() => undefined);
  }

  /**
   * Opens each screen by its address at both widths (a fresh load, so charts are drawn at the
   * width they are shown at), then checks the page width and runs axe-core.
   */
  async function checkScreens(page: Page, role: string, list: Screen[]): Promise<void> {
    for (const size of WIDTHS) {
      await page.setViewportSize(size);
      for (const screen of list) {
        const label = `${screen.name} (${role}) at ${size.width} px`;
        await page.goto(`${gyre.baseUrl}${screen.path()}`, { waitUntil: 'load' });
        await screen.ready(page).first().waitFor({ timeout: 30_000 });
        await settle(page);
        const fit = await sticksOutSideways(page);
        expect
          .soft(
            fit.page,
            `${label}: the page is ${fit.page} px wide in a ${fit.window} px window; sticking out: ${fit.out.join('; ')}`,
          )
          .toBeLessThanOrEqual(fit.window);
        const result = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
        const serious = result.violations
          .filter((v) => v.impact === 'serious' || v.impact === 'critical')
          .map(
            (v) =>
              `${v.id} (${v.impact}): ${v.nodes
                .slice(0, 4)
                .map((node) => node.target.join(' '))
                .join(' | ')}${v.nodes.length > 4 ? ` and ${v.nodes.length - 4} more` : ''}`,
          );
        expect.soft(serious, `axe on ${label}`).toEqual([]);
        if (size.width === 390) await screenshot(page, `a11y-${role}-${fileName(screen.name)}`);
        if (size.width === 1440 && USER_GUIDE_SCREENS[role]?.includes(screen.name)) {
          // A smaller desktop window keeps each picture under 150 KB; charts redraw to fit it.
          await page.setViewportSize(USER_GUIDE_SIZE);
          await settle(page);
          await page.waitForTimeout(1000);
          await userGuideImage(page, `${role}-${fileName(screen.name)}`);
          await page.setViewportSize(size);
        }
      }
    }
  }

  /** A new page signed in as the study's `role`, its screens checked; the page, for more checks. */
  async function signedInScreens(role: keyof typeof PEOPLE, list: Screen[]): Promise<Page> {
    const page = await newPage();
    await signInThroughPage(page, gyre.baseUrl, PEOPLE[role].email, '/');
    await checkScreens(page, role, list);
    return page;
  }

  beforeAll(async () => {
    gyre = await startGyre();
    data = await setUpInventedStudy(gyre, PEOPLE);
  }, 600_000);

  afterEach(async () => {
    for (const browser of browsers.splice(0)) await browser.close();
  });

  afterAll(async () => {
    for (const browser of browsers.splice(0)) await browser.close();
    await gyre?.stop();
  });

  it(
    'before sign-in: sign-in and forgotten password',
    async () => {
      const page = await newPage();
      await checkScreens(page, 'visitor', [screens.signIn, screens.forgot]);
    },
    SCREENS_TIMEOUT_MS,
  );

  // The roles whose screens need nothing beyond the layout and accessibility checks.
  const plainRoles: Array<['technician' | 'coordinator' | 'admin', Screen[]]> = [
    ['technician', [screens.home, screens.intake, screens.notFound]],
    ['coordinator', [screens.home, screens.reports, screens.signedReports]],
    [
      'admin',
      [
        screens.home,
        screens.team,
        screens.outbox,
        screens.ledger,
        screens.studySetup,
        screens.adminOverview,
      ],
    ],
  ];
  for (const [role, list] of plainRoles) {
    it(
      `the ${role}'s screens`,
      async () => {
        await signedInScreens(role, list);
      },
      SCREENS_TIMEOUT_MS,
    );
  }

  it(
    "the analyst's screens, the skip link, the phone menu and a long name",
    async () => {
      const page = await signedInScreens('analyst', [
        screens.home,
        screens.review,
        screens.participants,
        screens.participant,
        screens.overview,
        screens.studySettings,
        screens.reports,
      ]);

      for (const size of WIDTHS) {
        await page.setViewportSize(size);
        await page.goto(`${gyre.baseUrl}/`, { waitUntil: 'load' });
        await screens.home.ready(page).waitFor();
        // Landmarks: the header (banner) and main, each once.
        await expect(page.getByRole('banner').count()).resolves.toBe(1);
        await expect(page.getByRole('main').count()).resolves.toBe(1);
        // From a fresh load, the first Tab lands on the skip link; following it focuses main.
        await page.keyboard.press('Tab');
        const first = await page.evaluate(() => document.activeElement?.textContent ?? '');
        expect(first, `first Tab at ${size.width} px`).toBe('Skip to main content');
        await expect(
          page.getByRole('link', { name: 'Skip to main content' }).isVisible(),
        ).resolves.toBe(true);
        await page.keyboard.press('Enter');
        await expect(page.evaluate(() => document.activeElement?.tagName)).resolves.toBe('MAIN');
        // "Gyre" stays on one line: one client rect for its text (one per line box).
        const brandLines = await page.locator('.gyre-brand-name').evaluate((el) => {
          const range = document.createRange();
          range.selectNodeContents(el);
          return range.getClientRects().length;
        });
        expect(brandLines, `lines of "Gyre" at ${size.width} px`).toBe(1);
        // The long name is cut with an ellipsis on a phone, yet shows a readable part of it.
        const name = page
          .getByRole('banner')
          .locator('.ant-typography', { hasText: PEOPLE.analyst.name })
          .first();
        const box = await name.evaluate((el) => ({
          shown: el.clientWidth,
          whole: el.scrollWidth,
          overflow: getComputedStyle(el).textOverflow,
        }));
        if (size.width === 390) {
          expect(box.overflow).toBe('ellipsis');
          expect(box.shown).toBeGreaterThanOrEqual(60);
        }
      }

      // At 1440 px the menu runs along the header; at 390 px a button opens it in a drawer.
      await page.setViewportSize(WIDTHS[0]);
      await page.goto(`${gyre.baseUrl}/`, { waitUntil: 'load' });
      await screens.home.ready(page).waitFor();
      const desktopNav = page.getByRole('navigation', { name: 'Main' });
      await desktopNav.getByRole('link', { name: 'Participants' }).waitFor();
      await expect(page.getByRole('button', { name: 'Open the menu' }).count()).resolves.toBe(0);

      await page.setViewportSize(WIDTHS[1]);
      const opener = page.getByRole('button', { name: 'Open the menu' });
      await opener.waitFor();
      await expect(opener.getAttribute('aria-expanded')).resolves.toBe('false');
      await opener.focus();
      await page.keyboard.press('Enter');
      const drawerNav = page.getByRole('dialog').getByRole('navigation', { name: 'Main' });
      const entry = drawerNav.getByRole('link', { name: 'Participants' });
      await entry.waitFor();
      await expect(entry.isVisible()).resolves.toBe(true);
      await screenshot(page, 'a11y-analyst-phone-menu-open');
      await entry.click();
      await screens.participants.ready(page).first().waitFor();
      await page.getByRole('dialog').waitFor({ state: 'hidden' });
      expect(new URL(page.url()).pathname).toBe('/participants');
    },
    SCREENS_TIMEOUT_MS,
  );

  it(
    "the monitor's screens and the Participants site filter by keyboard",
    async () => {
      const page = await signedInScreens('monitor', [
        screens.home,
        screens.participants,
        screens.participant,
        screens.review,
        screens.ledger,
        screens.overview,
        screens.studySettings,
      ]);

      await page.setViewportSize(WIDTHS[0]);
      await page.goto(`${gyre.baseUrl}/participants`, { waitUntil: 'load' });
      await screens.participants.ready(page).first().waitFor();
      // Tab from the top of the page until the focus is on the Site filter (a labelled select).
      let onFilter = false;
      for (let presses = 0; presses < 40 && !onFilter; presses++) {
        await page.keyboard.press('Tab');
        onFilter = await page.evaluate(
          () => document.activeElement?.getAttribute('aria-label') === 'Site',
        );
      }
      expect(onFilter, 'Tab reaches the Site filter of the Participants list').toBe(true);
      // The arrow key opens its options; the study's site is offered by its full name.
      await page.keyboard.press('ArrowDown');
      await page
        .locator('.ant-select-item-option', { hasText: data.site.name })
        .waitFor({ timeout: 5000 });
    },
    SCREENS_TIMEOUT_MS,
  );
});

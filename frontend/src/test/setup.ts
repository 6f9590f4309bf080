import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';
import { DESKTOP_WIDTH_PX, matchesWidthQuery, setViewportWidth } from './viewport';

// A 2-core machine shared with other work renders antd slowly; wait longer than the 1 s default.
configure({ asyncUtilTimeout: 5000 });

afterEach(() => {
  cleanup();
  setViewportWidth(DESKTOP_WIDTH_PX);
});

// antd reads these browser APIs, which jsdom lacks. Width queries answer for a desktop
// window unless a test sets another width (see ./viewport).
Object.defineProperty(window, 'matchMedia', {
  writable: true,
  value: (query: string) => ({
    matches: matchesWidthQuery(query),
    media: query,
    onchange: null,
    addListener: () => undefined,
    removeListener: () => undefined,
    addEventListener: () => undefined,
    removeEventListener: () => undefined,
    dispatchEvent: () => false,
  }),
});
window.ResizeObserver ??= class {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
};

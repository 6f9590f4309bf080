/**
 * A box that scrolls sideways on its own when its content (a wide table) is wider than the
 * screen, so the page itself never does. It takes the keyboard focus and has a name, so a
 * keyboard can scroll it too (WCAG 2.1.1); use it where the content has nothing focusable.
 */
export function ScrollRegion({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div role="region" aria-label={label} tabIndex={0} className="gyre-scroll-region">
      {children}
    </div>
  );
}

/**
 * The window width that the test `matchMedia` answers for, so antd's responsive props
 * (`Table` columns' `responsive`, `Descriptions`' `column`) can be checked at phone width.
 */
export const DESKTOP_WIDTH_PX = 1280;
/** A common phone width in CSS pixels. */
export const PHONE_WIDTH_PX = 390;

let widthPx = DESKTOP_WIDTH_PX;

export function setViewportWidth(px: number): void {
  widthPx = px;
}

/** Whether a media query of `min-width`/`max-width` conditions holds at the current width. */
export function matchesWidthQuery(query: string): boolean {
  const conditions = [...query.matchAll(/\((min|max)-width:\s*([\d.]+)px\)/g)];
  if (conditions.length === 0) return false;
  return conditions.every(([, side, value]) =>
    side === 'min' ? widthPx >= Number(value) : widthPx <= Number(value),
  );
}

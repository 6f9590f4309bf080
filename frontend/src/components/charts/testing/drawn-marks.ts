import { screen, within } from '@testing-library/react';

/**
 * The mark types the figure named `name` asks for, in order (as the stand-in chart of
 * `fake-g2-plot` lists them), once the figure and its lazily loaded chart have shown.
 */
export async function drawnMarks(name: string): Promise<string | undefined> {
  const figure = await screen.findByRole('figure', { name }, { timeout: 15_000 });
  const plot = await within(figure).findByTestId('g2-plot', {}, { timeout: 15_000 });
  return plot.dataset.marks;
}

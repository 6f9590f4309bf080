import { AxisTick, linearAxis, LinearAxisOptions, logAxis } from '@gyre/shared';

/*
 * The report's plots take their ticks from shared/src/chart-ticks.ts (d3's nice numbers),
 * the same as the client's charts: the same data gives the same axes on screen and on paper.
 */

/** Maps a data value to a page coordinate in points. */
export interface Scale {
  domain: [number, number];
  range: [number, number];
  toPt(value: number): number;
  ticks: AxisTick[];
  log: boolean;
}

/** A linear scale over `domain` with the given ticks. */
export function linearScale(
  domain: [number, number],
  range: [number, number],
  ticks: AxisTick[],
): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  return {
    domain,
    range,
    ticks,
    log: false,
    toPt: (value) => r0 + ((value - d0) / (d1 - d0)) * (r1 - r0),
  };
}

/** A linear scale on the nice axis of [min, max] (widened to whole steps unless told not to). */
export function niceLinearScale(
  min: number,
  max: number,
  range: [number, number],
  options: LinearAxisOptions,
): Scale {
  const axis = linearAxis(min, max, options);
  return linearScale(axis.domain, range, axis.ticks);
}

/** Whole decades covering [min, max] of positive values; ticks at 1-2-5 or at decades. */
export function logScale(min: number, max: number, range: [number, number], maxTicks = 7): Scale {
  const axis = logAxis(min, max, { maxTicks });
  const [r0, r1] = range;
  const [l0, l1] = axis.domain.map(Math.log10);
  return {
    domain: axis.domain,
    range,
    ticks: axis.ticks,
    log: true,
    toPt: (value) =>
      r0 + ((Math.log10(Math.max(value, axis.domain[0])) - l0) / (l1 - l0)) * (r1 - r0),
  };
}

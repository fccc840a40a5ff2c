/**
 * The colours every Remap plot uses, in the order series get them. Two families
 * that colour-blind readers tell apart (blue and orange, after the Okabe & Ito
 * palette "Color Universal Design", 2008), then greys and lighter or darker
 * shades of the same two. Series 1 is usually the target or reference, series 2
 * the source before mapping, series 3 the mapped source.
 */
export const PALETTE: readonly string[] = Object.freeze([
  '#0072B2', // blue
  '#E69F00', // orange
  '#4D4D4D', // dark grey
  '#56B4E9', // sky blue
  '#D55E00', // vermillion (dark orange)
  '#999999', // grey
]);

/** Ink for axes, ticks and text; the grid lines are a lighter grey. */
export const INK = '#222222';
export const GRID = '#E3E3E3';

/**
 * The colour of series `i` (0-based), cycling through PALETTE. O(1).
 * @example seriesColour(1) // '#E69F00'
 */
export function seriesColour(i: number): string {
  const k = Math.abs(Math.trunc(i)) % PALETTE.length;
  return PALETTE[k];
}

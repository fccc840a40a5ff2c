/**
 * Handles: the text that names a fitted map in a cell
 * ("remap:linear:5000x3:0f3a2c1b9d4e77"), and the progress text a fitting cell
 * shows instead until its map is ready.
 */

/** Builds a handle from its parts. */
export function makeHandle(method: string, n: number, d: number, hash: string): string {
  return `remap:${method}:${n}x${d}:${hash}`;
}

/** True when text looks like a handle this product writes. */
export function isHandle(text: string): boolean {
  return /^remap:[a-z-]+:\d+x\d+:[0-9a-f]+$/.test(text.trim());
}

/** The text a streaming REMAP.FIT cell shows while it works starts with this. */
export const PROGRESS_PREFIX = 'fitting ';

/** True when text is a streaming REMAP.FIT cell's progress text rather than a handle. */
export function isProgressText(text: string): boolean {
  return text.startsWith(PROGRESS_PREFIX);
}

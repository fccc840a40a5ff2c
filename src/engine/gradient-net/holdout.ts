import type { Random } from '../stats/random';

/** Rows kept aside to choose between training checkpoints, and rows trained on. */
export interface HoldoutSplit {
  /** Row indices trained on (increasing). */
  readonly train: Uint32Array;
  /** Row indices held out (increasing); empty when the sample is too small to split. */
  readonly held: Uint32Array;
}

/** Largest held-out share and count, and the smallest held-out set worth having (common practice: a 20 % validation split). */
export const HOLDOUT_SHARE = 0.2;
export const HOLDOUT_MAX_ROWS = 1000;
export const HOLDOUT_MIN_ROWS = 20;

/**
 * A seeded split of n rows into training rows and held-out rows: floor(n / 5)
 * rows, at most 1,000, are held out, chosen uniformly at random by `rng`
 * (Random.choose). With fewer than 20 rows to hold out, or when either part would
 * carry no weight, nothing is held out (`held` empty) and the caller validates on
 * the training rows. Cost O(n).
 * @param n rows, >= 1. @param weights row weights or null. @param rng seeded generator (advanced).
 * @example holdoutSplit(10, null, new Random(1)).held.length // 0 (too few rows)
 */
export function holdoutSplit(n: number, weights: Float64Array | null, rng: Random): HoldoutSplit {
  const size = Math.min(HOLDOUT_MAX_ROWS, Math.floor(n * HOLDOUT_SHARE));
  const all = new Uint32Array(n);
  for (let i = 0; i < n; i++) all[i] = i;
  if (size < HOLDOUT_MIN_ROWS) return { train: all, held: new Uint32Array(0) };
  const chosen = rng.choose(n, size);
  const isHeld = new Uint8Array(n);
  for (let t = 0; t < size; t++) isHeld[chosen[t]] = 1;
  const held = new Uint32Array(size);
  const train = new Uint32Array(n - size);
  let h = 0;
  let r = 0;
  let heldWeight = 0;
  let trainWeight = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (isHeld[i]) {
      held[h++] = i;
      heldWeight += w;
    } else {
      train[r++] = i;
      trainWeight += w;
    }
  }
  if (!(heldWeight > 0) || !(trainWeight > 0)) return { train: all, held: new Uint32Array(0) };
  return { train, held };
}

/** Rows `idx` of a row-major n x d array (and their weights), as new arrays. O(|idx| d). */
export function pickRows(
  data: Float64Array,
  weights: Float64Array | null,
  d: number,
  idx: Uint32Array,
): { n: number; d: number; data: Float64Array; weights: Float64Array | null } {
  const out = new Float64Array(idx.length * d);
  for (let r = 0; r < idx.length; r++) for (let k = 0; k < d; k++) out[r * d + k] = data[idx[r] * d + k];
  const w = weights ? Float64Array.from(idx, (i) => weights[i]) : null;
  return { n: idx.length, d, data: out, weights: w };
}

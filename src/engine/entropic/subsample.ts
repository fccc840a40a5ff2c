/**
 * A seeded choice of `k` distinct row indices out of `n`, in increasing order
 * (all rows when k >= n). Partial Fisher-Yates shuffle driven by Mulberry32
 * (a 32-bit generator; public domain, T. Ettinger 2017), so the same seed gives
 * the same rows in every JavaScript engine. O(n) time and memory.
 * @param n rows to choose from (>= 0); k rows wanted (>= 0); seed any finite number (its integer part's low 32 bits are used).
 * @example subsampleRows(5, 10, 1) // Int32Array [0, 1, 2, 3, 4]
 */
export function subsampleRows(n: number, k: number, seed: number): Int32Array {
  const idx = new Int32Array(n);
  for (let i = 0; i < n; i++) idx[i] = i;
  if (k >= n) return idx;
  let state = (Math.trunc(seed) ^ 0x2545f491) >>> 0;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  for (let i = 0; i < k; i++) {
    const j = i + Math.min(n - i - 1, Math.floor(next() * (n - i)));
    const t = idx[i];
    idx[i] = idx[j];
    idx[j] = t;
  }
  return idx.slice(0, k).sort();
}

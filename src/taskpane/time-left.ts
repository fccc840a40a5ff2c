/**
 * An estimate of the time a running fit still needs, from its progress so far:
 * the average pace since the start (steps per millisecond) times the steps
 * left, capped by the time budget when there is one. Null until there is
 * enough to go on (two reports, some steps done). Pure; O(1).
 * @param step steps done; @param of steps planned (> 0); @param elapsedMs time so far.
 * @param budgetMs the fit's time budget, or Infinity.
 * @example timeLeftMs(100, 1000, 10_000, Infinity) // 90_000
 */
export function timeLeftMs(step: number, of: number, elapsedMs: number, budgetMs = Infinity): number | null {
  if (!(step > 0 && of > 0 && elapsedMs > 0) || step > of) return null;
  const left = ((of - step) * elapsedMs) / step;
  return Math.max(0, Math.min(left, budgetMs - elapsedMs));
}

/**
 * Milliseconds in words for the pane: "45 s", "3 min 20 s", "1 h 5 min". O(1).
 * @example durationText(200_000) // '3 min 20 s'
 */
export function durationText(ms: number): string {
  const s = Math.max(0, Math.round(ms / 1000));
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${s % 60} s`;
  return `${Math.floor(m / 60)} h ${m % 60} min`;
}

import type { Progress } from '../engine/map';

/** Everyone watching fits in this session (the pane), told of every progress report with the fit's handle. */
const watchers = new Set<(handle: string, p: Progress) => void>();

/**
 * Calls `listener` with every progress report of every fit in this session
 * (cells and pane alike). Returns a function that stops it. O(1).
 */
export function watchFits(listener: (handle: string, p: Progress) => void): () => void {
  watchers.add(listener);
  return () => watchers.delete(listener);
}

/** Tells every watcher of one progress report. O(#watchers). */
export function tellWatchers(handle: string, p: Progress): void {
  for (const w of watchers) w(handle, p);
}

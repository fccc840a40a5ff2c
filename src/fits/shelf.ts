import { currentKeeper, type KeptInfo } from './keeper';

/** What a shelf holds: something with JSON to keep and resources to free. */
export interface Shelved {
  toJSON(): unknown;
  dispose(): void;
}

/**
 * Fitted maps of one kind by handle, for this session: the most recently used
 * `max` (older ones are disposed), fits in flight shared by handle, and the
 * host's Keeper (the workbook, in the add-in) asked for a handle this session
 * lacks. store.ts shelves single maps and grouped-store.ts maps by group; both
 * behave alike because both are this class.
 */
export class Shelf<T extends Shelved> {
  private readonly items = new Map<string, T>();
  private readonly inflight = new Map<string, Promise<T>>();

  /**
   * @param restore reads kept JSON text back into a map; throws when the text is not one it reads.
   * @param max how many maps the shelf keeps (64: a workbook's worth, design choice).
   */
  constructor(
    private readonly restore: (json: string) => T,
    private readonly max = 64,
  ) {}

  /** Remembers a map under its handle (most recently used last; the oldest past `max` is disposed). */
  remember(handle: string, map: T): void {
    this.items.delete(handle);
    this.items.set(handle, map);
    while (this.items.size > this.max) {
      const oldest = this.items.keys().next().value as string;
      this.items.get(oldest)?.dispose();
      this.items.delete(oldest);
    }
  }

  /** The map under `handle` if this session has it (and marks it recently used). */
  recall(handle: string): T | undefined {
    const m = this.items.get(handle);
    if (m) {
      this.items.delete(handle);
      this.items.set(handle, m);
    }
    return m;
  }

  /** The running fit for `handle`, if one is in flight in this session. */
  running(handle: string): Promise<T> | undefined {
    return this.inflight.get(handle);
  }

  /** Every handle on the shelf, most recent last. */
  handles(): string[] {
    return [...this.items.keys()];
  }

  /** Forgets a map (and disposes it). */
  forget(handle: string): void {
    this.items.get(handle)?.dispose();
    this.items.delete(handle);
  }

  /** Forgets every map. */
  forgetAll(): void {
    for (const m of this.items.values()) m.dispose();
    this.items.clear();
    this.inflight.clear();
  }

  /**
   * The map for `handle`: this session's, else the keeper's copy, else fitted by
   * `fit` (and then kept); a fit already running for the handle is shared, not
   * started twice. A kept copy that no longer reads (or a keeper that fails) is
   * fitted again, and the new copy replaces it.
   */
  recallOrFit(handle: string, fit: () => T | Promise<T>, info?: KeptInfo): T | Promise<T> {
    const known = this.recall(handle);
    if (known) return known;
    const running = this.inflight.get(handle);
    if (running) return running;
    const finish = (json: string | null): T | Promise<T> => {
      const restored = this.fromKept(handle, json);
      if (restored) return restored;
      const r = fit();
      if (!(r instanceof Promise)) {
        this.store(handle, r, info);
        return r;
      }
      const p = r.then(
        (m) => {
          this.inflight.delete(handle);
          this.store(handle, m, info);
          return m;
        },
        (e: unknown) => {
          this.inflight.delete(handle);
          throw e;
        },
      );
      this.inflight.set(handle, p);
      return p;
    };
    const kept = keptText(handle);
    return kept instanceof Promise ? kept.then(finish, () => finish(null)) : finish(kept);
  }

  /**
   * The map for `handle` for a cell that uses it but cannot fit it: this
   * session's, a fit in flight, or the keeper's copy; `missing` (which throws
   * a message saying what to do) when there is none. A kept copy that does not
   * read throws its own error: the using cell cannot refit.
   */
  find(handle: string, missing: () => never, accepts: (json: string) => boolean = () => true): T | Promise<T> {
    const m = this.recall(handle);
    if (m) return m;
    const running = this.inflight.get(handle);
    if (running) return running;
    const keeper = currentKeeper();
    if (!keeper) return missing();
    const kept = keeper.load(handle);
    const found = (json: string | null): T => {
      if (!json || !accepts(json)) return missing();
      const restored = this.restore(json);
      this.remember(handle, restored);
      return restored;
    };
    return kept instanceof Promise ? kept.then(found) : found(kept);
  }

  /** A kept copy restored and remembered, or null when `json` is absent or does not read. */
  private fromKept(handle: string, json: string | null): T | null {
    if (!json) return null;
    try {
      const m = this.restore(json);
      this.remember(handle, m);
      return m;
    } catch {
      return null;
    }
  }

  /** Remembers a fitted map and gives it to the keeper (best effort: the map still works in this session). */
  private store(handle: string, m: T, info?: KeptInfo): void {
    this.remember(handle, m);
    const keeper = currentKeeper();
    if (!keeper) return;
    try {
      const r = keeper.save(handle, JSON.stringify(m.toJSON()), info);
      if (r instanceof Promise) r.catch(() => undefined);
    } catch {
      /* keeping is best effort */
    }
  }
}

/** The keeper's text for `handle` (null when none is kept or there is no keeper; a damaged copy reads as none). */
function keptText(handle: string): string | null | Promise<string | null> {
  try {
    return currentKeeper()?.load(handle) ?? null;
  } catch {
    return null;
  }
}

import { RemapError } from '../errors';
import type { Progress } from '../map';

/** What `solveAssignment` accepts besides the cost table. */
export interface AssignmentOptions {
  /** Checked now and then; when `aborted` becomes true the solver throws RemapError(kind 'cancelled'). */
  readonly signal?: { readonly aborted: boolean };
  /** Called now and then during the augmenting phase (step = paths found, of = paths needed). */
  readonly onProgress?: (p: Progress) => void;
  /** The name that error messages start with (default 'solveAssignment'). */
  readonly caller?: string;
  /**
   * Column potentials to start from (length n, finite), such as `auctionPrices` gives: the start-up
   * column reduction is then skipped and every row starts free. Any finite prices give the same
   * optimal total; good ones make the augmenting searches short.
   */
  readonly prices?: Float64Array;
}

/** An optimal one-to-one assignment of n rows to n columns, with an optimality certificate. */
export interface Assignment {
  /** rowToCol[i] is the column assigned to row i. */
  readonly rowToCol: Int32Array;
  /** colToRow[j] is the row assigned to column j (the inverse permutation). */
  readonly colToRow: Int32Array;
  /** Sum over rows of cost[i][rowToCol[i]]. */
  readonly total: number;
  /**
   * Dual potentials u (rows) and v (columns): u_i + v_j <= c_ij for every cell
   * (up to rounding) with equality on assigned cells, so sum(u) + sum(v) = total
   * certifies that no other assignment costs less (linear-programming duality).
   */
  readonly rowPotential: Float64Array;
  readonly colPotential: Float64Array;
  /** Rows matched by a shortest augmenting path (the rest were matched by the cheap start-up passes). */
  readonly augmentations: number;
}

/**
 * Solves the linear assignment problem exactly: the permutation sigma of
 * 0..n-1 minimising sum_i cost[i][sigma(i)] for a dense n x n cost table.
 *
 * Method: Jonker & Volgenant, "A shortest augmenting path algorithm for dense
 * and sparse linear assignment problems", Computing 38 (1987) 325-340:
 * column reduction, reduction transfer and two passes of augmenting row
 * reduction give a partial assignment and column prices v cheaply; each row
 * left free is then matched by a shortest augmenting path (Dijkstra on the
 * reduced costs c_ij - v_j, which stay >= 0 for matched rows), and the prices
 * of the columns finished by that search are raised so reduced costs stay >= 0.
 * Ties and identical rows or columns are fine; the result is one optimal
 * assignment (which one, among equals, is fixed by the input order).
 *
 * Every loop is bounded: the row-reduction passes, which can chase each other
 * around ties in floating point, hand a row to the augmenting phase after a
 * fixed number of re-tries; each augmenting search ends within 2n steps.
 *
 * Cost: O(n^2) memory for the table (the caller's); time O(n^3) in the worst
 * case, far less on typical data (n = 2,000 takes about a second).
 *
 * @param cost row-major n x n table, `cost[i * n + j]`, every entry finite (any sign). Not mutated.
 * @param n number of rows and of columns, a whole number >= 0.
 * @param options optional cancellation signal, progress callback and caller name.
 * @throws RemapError (kind 'value') if n is not a whole number >= 0, the table has the wrong length,
 *   or an entry is not finite; RemapError (kind 'cancelled') if `options.signal.aborted` turns true.
 * @example
 * solveAssignment(Float64Array.from([6, 2, 9,  1, 7, 4,  8, 3, 5]), 3)
 * // { rowToCol: Int32Array [1, 0, 2], colToRow: Int32Array [1, 0, 2], total: 8, ... }
 */
export function solveAssignment(cost: Float64Array, n: number, options: AssignmentOptions = {}): Assignment {
  const fn = options.caller ?? 'solveAssignment';
  if (!Number.isInteger(n) || n < 0) {
    throw new RemapError(`${fn}: the size n must be a whole number of at least 0, not ${String(n)}.`);
  }
  if (!(cost instanceof Float64Array) || cost.length !== n * n) {
    const got = cost instanceof Float64Array ? `${cost.length} entries` : 'not a Float64Array';
    throw new RemapError(
      `${fn}: the cost table must be a Float64Array of n x n = ${n * n} entries, but it is ${got}; give one cost per (row, column) pair, row by row.`,
    );
  }
  for (let t = 0; t < cost.length; t++) {
    if (!Number.isFinite(cost[t])) {
      throw new RemapError(
        `${fn}: the cost in row ${Math.floor(t / n) + 1}, column ${(t % n) + 1} is not a finite number (${cost[t]}); every cost must be finite.`,
      );
    }
  }
  const { signal, onProgress } = options;
  const started = Date.now();
  checkAbort(signal, fn);

  const rowsol = new Int32Array(n).fill(-1);
  const colsol = new Int32Array(n).fill(-1);
  const v = new Float64Array(n);
  let augmentations = 0;

  if (n === 1) {
    rowsol[0] = 0;
    colsol[0] = 0;
    v[0] = cost[0];
  } else if (n > 1) {
    if (options.prices) {
      if (options.prices.length !== n || !options.prices.every(Number.isFinite)) {
        throw new RemapError(`${fn}: the starting prices must be ${n} finite numbers, one per column.`);
      }
      v.set(options.prices);
    }
    augmentations = jonkerVolgenant(cost, n, rowsol, colsol, v, signal, onProgress, started, fn, !!options.prices);
  }

  const u = new Float64Array(n);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const j = rowsol[i];
    u[i] = cost[i * n + j] - v[j];
    total += cost[i * n + j];
  }
  return { rowToCol: rowsol, colToRow: colsol, total, rowPotential: u, colPotential: v, augmentations };
}

function checkAbort(signal: { readonly aborted: boolean } | undefined, fn: string): void {
  if (signal?.aborted) throw new RemapError(`${fn}: the matching was cancelled before it finished.`, 'cancelled');
}

/** The four phases of Jonker-Volgenant on n >= 2; fills rowsol, colsol and v; returns the number of augmenting paths. */
function jonkerVolgenant(
  c: Float64Array,
  n: number,
  rowsol: Int32Array,
  colsol: Int32Array,
  v: Float64Array,
  signal: { readonly aborted: boolean } | undefined,
  onProgress: ((p: Progress) => void) | undefined,
  started: number,
  fn: string,
  warm: boolean,
): number {
  const free = new Int32Array(n);
  let numfree = 0;
  if (warm) {
    // Prices given: every row starts free and the augmenting row reduction below assigns most of them.
    for (let i = 0; i < n; i++) free[numfree++] = i;
  } else numfree = coldStart(c, n, rowsol, colsol, v, free);
  checkAbort(signal, fn);
  return augment(c, n, rowsol, colsol, v, free, numfree, signal, onProgress, started, fn);
}

/** Column reduction and reduction transfer (Jonker & Volgenant 1987): prices and a partial assignment from scratch; returns the free rows' count. */
function coldStart(c: Float64Array, n: number, rowsol: Int32Array, colsol: Int32Array, v: Float64Array, free: Int32Array): number {
  // Column reduction: v_j = min_i c_ij; each column goes to its minimising row
  // if that row has no cheaper column yet. Column minima are found row by row
  // (row-major, cache friendly); ties go to the first row, as in the paper.
  const colMin = new Float64Array(n).fill(Infinity);
  const colArg = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let j = 0; j < n; j++) {
      const h = c[row + j];
      if (h < colMin[j]) {
        colMin[j] = h;
        colArg[j] = i;
      }
    }
  }
  const matches = new Int32Array(n);
  for (let j = n - 1; j >= 0; j--) {
    const imin = colArg[j];
    v[j] = colMin[j];
    if (++matches[imin] === 1) {
      rowsol[imin] = j;
      colsol[j] = imin;
    } else if (v[j] < v[rowsol[imin]]) {
      const j1 = rowsol[imin];
      rowsol[imin] = j;
      colsol[j] = imin;
      colsol[j1] = -1;
    } else {
      colsol[j] = -1;
    }
  }
  // Reduction transfer: a row holding exactly one column passes its slack to
  // that column's price, so other rows find that column dearer.
  let numfree = 0;
  for (let i = 0; i < n; i++) {
    if (matches[i] === 0) {
      free[numfree++] = i;
    } else if (matches[i] === 1) {
      const j1 = rowsol[i];
      const row = i * n;
      let min = Infinity;
      for (let j = 0; j < n; j++) {
        if (j !== j1) {
          const h = c[row + j] - v[j];
          if (h < min) min = h;
        }
      }
      v[j1] -= min;
    }
  }
  return numfree;
}

/** Augmenting row reduction, then shortest augmenting paths for the rows still free; returns the number of paths. */
function augment(
  c: Float64Array,
  n: number,
  rowsol: Int32Array,
  colsol: Int32Array,
  v: Float64Array,
  free: Int32Array,
  numfree: number,
  signal: { readonly aborted: boolean } | undefined,
  onProgress: ((p: Progress) => void) | undefined,
  started: number,
  fn: string,
): number {
  // Augmenting row reduction, two passes. A free row takes its cheapest column
  // (reduced cost umin), lowering that column's price by the gap to its second
  // cheapest (usubmin) so the row stays on its minimum; the row it displaces
  // is tried again at once. Re-tries are capped: in floating point a gap can
  // round away and two rows could then trade a column forever.
  const retryCap = 4 * n + 16;
  for (let pass = 0; pass < 2 && numfree > 0; pass++) {
    let k = 0;
    const prvnumfree = numfree;
    numfree = 0;
    let retries = 0;
    let steps = 0;
    while (k < prvnumfree) {
      if ((++steps & 255) === 0) checkAbort(signal, fn);
      const i = free[k++];
      const row = i * n;
      let umin = c[row] - v[0];
      let j1 = 0;
      let j2 = -1;
      let usubmin = Infinity;
      for (let j = 1; j < n; j++) {
        const h = c[row + j] - v[j];
        if (h < usubmin) {
          if (h >= umin) {
            usubmin = h;
            j2 = j;
          } else {
            usubmin = umin;
            umin = h;
            j2 = j1;
            j1 = j;
          }
        }
      }
      let i0 = colsol[j1];
      const strict = umin < usubmin;
      if (strict) {
        v[j1] -= usubmin - umin;
      } else if (i0 > -1) {
        j1 = j2;
        i0 = colsol[j2];
      }
      rowsol[i] = j1;
      colsol[j1] = i;
      if (i0 > -1) {
        if (strict && retries < retryCap) {
          free[--k] = i0;
          retries++;
        } else {
          free[numfree++] = i0;
        }
      }
    }
  }
  checkAbort(signal, fn);

  // Augmentation: a shortest augmenting path from each row still free
  // (Dijkstra on the reduced costs). Columns are swept in index order with a
  // "finished" flag rather than through a shuffled list, so the cost table is
  // read row by row; relaxing a row and finding the next nearest column share
  // one sweep. Among columns at the same distance a free one is preferred,
  // which ends the search sooner.
  const dist = new Float64Array(n);
  const pred = new Int32Array(n);
  const done = new Uint8Array(n);
  const finished = new Int32Array(n);
  const paths = numfree;
  const every = Math.max(1, Math.floor(paths / 100));
  const report = (done: number): void => {
    if (!onProgress) return;
    onProgress({
      step: done,
      of: paths,
      loss: paths - done,
      elapsedMs: Date.now() - started,
      message: `matching rows: ${done} of ${paths} augmenting paths found (loss = rows still unmatched)`,
    });
  };
  report(0);
  for (let f = 0; f < paths; f++) {
    checkAbort(signal, fn);
    const freerow = free[f];
    const frow = freerow * n;
    let best = Infinity;
    let bestJ = -1;
    for (let j = 0; j < n; j++) {
      const h = c[frow + j] - v[j];
      dist[j] = h;
      pred[j] = freerow;
      if (h < best || (h === best && colsol[j] < 0 && colsol[bestJ] >= 0)) {
        best = h;
        bestJ = j;
      }
    }
    let nFinished = 0;
    let endofpath = -1;
    // Each pass finishes one column, so at most n passes.
    for (let pass = 0; pass < n; pass++) {
      const j1 = bestJ;
      const min = best;
      done[j1] = 1;
      finished[nFinished++] = j1;
      if (colsol[j1] < 0) {
        endofpath = j1;
        break;
      }
      const i = colsol[j1];
      const row = i * n;
      const h = c[row + j1] - v[j1] - min;
      best = Infinity;
      bestJ = -1;
      for (let j = 0; j < n; j++) {
        if (done[j] === 1) continue;
        let dj = dist[j];
        const v2 = c[row + j] - v[j] - h;
        if (v2 < dj) {
          dj = v2;
          dist[j] = v2;
          pred[j] = i;
        }
        if (dj < best || (dj === best && colsol[j] < 0 && colsol[bestJ] >= 0)) {
          best = dj;
          bestJ = j;
        }
      }
      if (bestJ < 0) break;
    }
    if (endofpath < 0) {
      throw new RemapError(`${fn}: internal error, an augmenting path search found no free column; please report this with the data.`, 'num');
    }
    // Lower the reduced costs along the finished columns so they stay >= 0:
    // v_j += dist_j - dist_end (dist_j <= dist_end for every finished column).
    const dEnd = dist[endofpath];
    for (let k = 0; k < nFinished; k++) {
      const j = finished[k];
      v[j] += dist[j] - dEnd;
      done[j] = 0;
    }
    // Flip the alternating path back to the free row.
    let i: number;
    let hops = 0;
    do {
      if (++hops > n + 1) {
        throw new RemapError(`${fn}: internal error, an augmenting path did not lead back to its row; please report this with the data.`, 'num');
      }
      i = pred[endofpath];
      colsol[endofpath] = i;
      const j1 = endofpath;
      endofpath = rowsol[i];
      rowsol[i] = j1;
    } while (i !== freerow);
    if ((f + 1) % every === 0 && f + 1 < paths) report(f + 1);
  }
  report(paths);
  return paths;
}

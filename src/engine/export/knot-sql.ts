import { RemapError } from '../errors';
import { sqlNumber } from './sql-text';

/** The most knots one column may have in exported SQL (its tables grow by about 150 characters a knot: some 15 MB here). */
export const MAX_SQL_KNOTS = 100_000;

/** One direction of a fitted 1-D map as its JSON stores it (see `OneWayMap`). */
export interface KnotTable {
  readonly keys: ArrayLike<number>;
  readonly vals: ArrayLike<number>;
  readonly kind: 'linear' | 'step';
  /** The data range this direction maps from. */
  readonly lo: number;
  readonly hi: number;
}

/** The SQL pieces of one column's knot map: table definitions (for a WITH clause), the joins, and the result expression. */
export interface KnotSql {
  readonly ctes: string[];
  readonly joins: string[];
  readonly expression: string;
}

/**
 * SQL computing a 1-D knot map at `x` with the same arithmetic as the engine's
 * `OneWayMap`: NULL stays NULL; outside [lo, hi] the tails (clamp: the end
 * value; linear: the end value plus the end slope times the distance); inside,
 * the segment keys[k] <= x < keys[k+1] is found by two joins on equality,
 * each computed from x in O(1):
 *   1. a grid of B equal buckets over [keys[0], keys[K-1]]: q = FLOOR((x - k0) s);
 *      the row of bucket q gives a finer grid of its own (start, scale, count)
 *      with one cell for each segment overlapping the bucket, so crowded
 *      stretches of knots (heavy tails) get fine cells where they are crowded;
 *   2. the cell's segments (about two), joined on the cell id, with the range
 *      condition x0 <= x < x1 picking the one segment.
 * Hash joins on small tables in every engine: no cross join over the knots,
 * O(1) work per row for knots that are not crowded at two scales at once.
 * Segment bounds come from the same doubles in the same order as in JavaScript,
 * so the buckets each row falls into are those the tables were built for.
 * Cost: O(K) time and text.
 * @param t knots (keys non-decreasing, at least one), as a fitted or restored map stores them.
 * @param x the input as SQL (e.g. `CAST(t.a AS DOUBLE)`).
 * @param tails 'clamp' or 'linear'.
 * @param id a short word naming this column's tables (letters, digits, _).
 * @param where starts error messages (the column).
 * @throws RemapError when there are more than MAX_SQL_KNOTS knots (fit with the knots setting to make the map compact).
 * @example knotSql({ keys: [0, 1], vals: [0, 10], kind: 'linear', lo: 0, hi: 1 }, 'x', 'clamp', 'c0', 'a').expression
 *   // 'CASE WHEN x IS NULL THEN NULL WHEN x < 0E0 THEN 0E0 ... ELSE LEAST(c0_s.y1, c0_s.y0 + (c0_s.y1 - c0_s.y0) * ((x - c0_s.x0) / (c0_s.x1 - c0_s.x0))) END'
 */
export function knotSql(t: KnotTable, x: string, tails: 'clamp' | 'linear', id: string, where: string): KnotSql {
  const k = knotParts(t, where);
  const n = sqlNumber;
  const v = {
    lo: n(k.lo),
    hi: n(k.hi),
    k0: n(k.k0),
    kEnd: n(k.kEnd),
    first: n(k.first),
    last: n(k.last),
    slopeLo: n(k.slopeLo),
    slopeHi: n(k.slopeHi),
    qmax: String(k.buckets - 1),
    scale: n(k.scale),
  };
  const head = knotHead(x, v, tails);
  if (k.grid.length === 0) return { ctes: [], joins: [], expression: `${head} ELSE ${v.first} END` };
  const g = `${id}_g`;
  const c = `${id}_s`;
  const ctes = [
    `${g} AS (SELECT * FROM (VALUES\n    ${k.grid.map((r) => `(${r[0]}, ${n(r[1])}, ${n(r[2])}, ${r[3]}, ${r[4]})`).join(',\n    ')}) AS v(q, start, scale, base, m))`,
    `${c} AS (SELECT * FROM (VALUES\n    ${k.cells.map((r) => `(${r[0]}, ${n(r[1])}, ${n(r[2])}, ${n(r[3])}, ${n(r[4])})`).join(',\n    ')}) AS v(cell, x0, x1, y0, y1))`,
  ];
  const joins = [`LEFT JOIN ${g} ON ${g}.q = ${bucketSql(x, v)}`, `LEFT JOIN ${c} ON ${cellJoin(c, g, x)}`];
  return { ctes, joins, expression: `${head} ELSE ${insideSql(t.kind, c, x)} END` };
}

/**
 * A knot map's numbers as SQL: literals for one map (knotSql), columns of a joined table for a map by group
 * (grouped-sql.ts), so both write the same expressions.
 */
export interface KnotTerms {
  readonly lo: string;
  readonly hi: string;
  readonly k0: string;
  readonly kEnd: string;
  readonly first: string;
  readonly last: string;
  readonly slopeLo: string;
  readonly slopeHi: string;
  /** The last bucket of the level-1 grid, and its scale (buckets per unit of x). */
  readonly qmax: string;
  readonly scale: string;
}

/**
 * The start of a knot map's CASE (without ELSE ... END): NULL stays NULL; `also` (optional WHEN clauses) comes next;
 * then the tails outside [lo, hi] (clamp: the end value; linear: the end value plus the end slope times the distance)
 * and the ends of the knots. O(1).
 */
export function knotHead(x: string, v: KnotTerms, tails: 'clamp' | 'linear', also = ''): string {
  const below = tails === 'linear' ? `${v.first} + ${v.slopeLo} * (${x} - ${v.lo})` : v.first;
  const above = tails === 'linear' ? `${v.last} + ${v.slopeHi} * (${x} - ${v.hi})` : v.last;
  return (
    `CASE WHEN ${x} IS NULL THEN NULL ${also}WHEN ${x} < ${v.lo} THEN ${below} WHEN ${x} > ${v.hi} THEN ${above} ` +
    `WHEN ${x} < ${v.k0} THEN ${v.first} WHEN ${x} >= ${v.kEnd} THEN ${v.last}`
  );
}

/** The level-1 bucket of x, NULL outside [k0, kEnd). O(1). */
export function bucketSql(x: string, v: KnotTerms): string {
  return `CASE WHEN ${x} >= ${v.k0} AND ${x} < ${v.kEnd} THEN LEAST(${v.qmax}, CAST(FLOOR((${x} - ${v.k0}) * ${v.scale}) AS BIGINT)) END`;
}

/** The join condition that picks the one segment of x's cell: the cell id from the bucket row g, then the range. */
export function cellJoin(c: string, g: string, x: string): string {
  return `${c}.cell = ${g}.base + GREATEST(0, LEAST(${g}.m - 1, CAST(FLOOR((${x} - ${g}.start) * ${g}.scale) AS BIGINT))) AND ${x} >= ${c}.x0 AND ${x} < ${c}.x1`;
}

/** The value inside the knots, from the segment row c: its start value (step) or the capped interpolation (linear), as OneWayMap computes it. */
export function insideSql(kind: 'linear' | 'step', c: string, x: string): string {
  return kind === 'step' ? `${c}.y0` : `LEAST(${c}.y1, ${c}.y0 + (${c}.y1 - ${c}.y0) * ((${x} - ${c}.x0) / (${c}.x1 - ${c}.x0)))`;
}

/** The numbers of one column's knot map in SQL: its ends and tails, its bucket grid and its cells (see `knotSql`). */
export interface KnotParts {
  readonly first: number;
  readonly last: number;
  readonly slopeLo: number;
  readonly slopeHi: number;
  readonly lo: number;
  readonly hi: number;
  /** The first and last knot. */
  readonly k0: number;
  readonly kEnd: number;
  /** Buckets of the level-1 grid and their scale (buckets per unit of x). */
  readonly buckets: number;
  readonly scale: number;
  /** Rows (q, start, scale, base, m) of the level-1 grid; empty when every knot is at one value. */
  readonly grid: number[][];
  /** Rows (cell, x0, x1, y0, y1) of the segments. */
  readonly cells: number[][];
}

/**
 * The tables and end values `knotSql` writes, as numbers (a map by group stacks them, one set per group). O(K).
 * @throws RemapError when there are more than MAX_SQL_KNOTS knots (fit with the knots setting to make the map compact).
 * @example knotParts({ keys: [0, 1], vals: [0, 10], kind: 'linear', lo: 0, hi: 1 }, 'a').cells // [[0, 0, 1, 0, 10]]
 */
export function knotParts(t: KnotTable, where: string): KnotParts {
  const { keys, vals, lo, hi } = t;
  const K = keys.length;
  if (K > MAX_SQL_KNOTS) {
    throw new RemapError(
      `SQL export (${where}): the map keeps ${K} knots, more than the ${MAX_SQL_KNOTS} SQL export writes; fit it again with the setting knots=2000 (a compact map, its error stated in its report) and export that.`,
    );
  }
  const first = vals[0];
  const last = vals[K - 1];
  // The end slopes, found as OneWayMap finds them (first and last segment of positive width).
  let a = 0;
  while (a + 1 < K && !(keys[a + 1] > keys[a])) a++;
  const slopeLo = a + 1 < K ? (vals[a + 1] - vals[a]) / (keys[a + 1] - keys[a]) : 0;
  let b = K - 1;
  while (b > 0 && !(keys[b] > keys[b - 1])) b--;
  const slopeHi = b > 0 ? (vals[b] - vals[b - 1]) / (keys[b] - keys[b - 1]) : 0;
  const k0 = keys[0];
  const kEnd = keys[K - 1];
  const range = kEnd - k0;
  const ends = { first, last, slopeLo, slopeHi, lo, hi, k0, kEnd };
  if (!(range > 0)) return { ...ends, buckets: 1, scale: 0, grid: [], cells: [] };

  // Segments of positive width: [x0, x1) -> y0 + (y1 - y0) ((x - x0) / (x1 - x0)), capped at y1, as OneWayMap computes it.
  const segs: number[] = [];
  for (let k = 0; k + 1 < K; k++) if (keys[k + 1] > keys[k]) segs.push(k);
  const S = segs.length;
  const B = Math.max(1, Math.min(S, 1 << 20));
  const s1 = B / range;
  const q1 = (v: number): number => Math.min(B - 1, Math.floor((v - k0) * s1));
  // Level 1: the segments overlapping each bucket (a superset: buckets q(x0) .. q(x1)).
  const byBucket: number[][] = Array.from({ length: B }, () => []);
  for (const k of segs) for (let q = q1(keys[k]); q <= q1(keys[k + 1]); q++) byBucket[q].push(k);
  const grid: number[][] = [];
  const cells: number[][] = [];
  let base = 0;
  for (let q = 0; q < B; q++) {
    const list = byBucket[q];
    if (list.length === 0) continue;
    const start = keys[list[0]];
    const width = keys[list[list.length - 1] + 1] - start;
    const m = list.length;
    const s2 = m / width;
    const q2 = (v: number): number => Math.max(0, Math.min(m - 1, Math.floor((v - start) * s2)));
    grid.push([q, start, s2, base, m]);
    for (const k of list) {
      for (let r = q2(keys[k]); r <= q2(keys[k + 1]); r++) cells.push([base + r, keys[k], keys[k + 1], vals[k], vals[k + 1]]);
    }
    base += m;
  }
  return { ...ends, buckets: B, scale: s1, grid, cells };
}

import { RemapError } from '../errors';
import type { MapJSON } from '../map';
import { restoreMap } from '../methods';
import { knotSql, type KnotTable } from './knot-sql';
import { networkSQL, type FrameJSON, type NetworkJSON } from './network-sql';
import { sqlName, sqlNumber, type QuoteStyle } from './sql-text';

/** How to write a map as SQL. */
export interface SqlOptions {
  /** The table (or view, or a dotted schema.table) holding the rows to map. */
  readonly table: string;
  /** The table's columns to map, one per map column, in the map's order; default the map's own column names. */
  readonly columns?: readonly string[];
  /** 'apply' (default) maps source values to the target; 'invert' maps back (not for gradient-net). */
  readonly direction?: 'apply' | 'invert';
  /** Appended to each mapped column's name for the result column; default '_mapped'. */
  readonly suffix?: string;
  /** How names that need quoting are quoted: 'double' (default; DuckDB, Trino, the SQL standard) or 'backtick' (Spark SQL). */
  readonly quote?: QuoteStyle;
}

/** The SQL of a map: one statement (WITH ... SELECT ... FROM ... joins) and the names of its result columns. */
export interface MapSql {
  readonly select: string;
  readonly outputs: readonly string[];
}

/**
 * Writes a fitted map as SQL that applies it to a table's columns, for DuckDB,
 * Spark SQL and Trino alike (standard CASE, arithmetic, LEAST, GREATEST, EXP,
 * CAST(... AS DOUBLE), numbers as DOUBLE literals):
 * `[WITH knot tables] SELECT t.*, <expression> AS <column>_mapped, ... FROM <table> AS t [joins]`.
 * - quantile, step, ordinal: per column, two small knot tables joined on a bucket
 *   number computed from the value (O(1) per row, no cross join; see `knotSql`), with the map's tails.
 *   Row weights shaped the knots when the map was fitted, so they are in the SQL.
 * - linear: m2 + A (x - m1), O(d^2) per row; the tails setting does not change a linear map.
 * - gradient-net (apply only): the network's arithmetic with EXP (see `networkSQL`).
 * - entropic, pairs: refused (they need every fitted row at apply time).
 * A NULL input gives NULL. Results agree with the engine's apply to rounding
 * (the same operations in the same order; EXP may differ in the last bits).
 * Cost: O(size of the map) time and text.
 * @param json a map's JSON (parsed and checked: parseMapJSON); its parameters are checked again by the method.
 * @throws RemapError for entropic or pairs maps (saying what to do instead), a gradient-net map with
 *   direction 'invert', a column list of the wrong length, a bad suffix, or a 1-D map with more knots than SQL export writes.
 * @example mapToSql(quantileJson, { table: 'wave2', columns: ['income'] }).select
 *   // 'WITH remap_c0_g AS (...), remap_c0_s AS (...)\nSELECT t.*,\n'
 *   //   + '  CASE WHEN CAST(t.income AS DOUBLE) IS NULL ... END AS income_mapped\nFROM wave2 AS t\nLEFT JOIN ...'
 */
export function mapToSql(json: MapJSON, options: SqlOptions): MapSql {
  const f = exportFrame(json.method, json.d, json.columns, options);
  // Every parameter is checked by the method's own reader before any is written out.
  restoreMap(json).dispose();
  const { expressions, ctes, joins } = mapExpressions(json, f.inputs, f.names, f.direction, 'remap');
  return selectText(f, options.table, expressions, ctes, joins);
}

/** What every SQL export settles first: the direction, the quoting, the columns to map (as SQL inputs) and the result names. */
export interface ExportFrame {
  readonly direction: 'apply' | 'invert';
  readonly style: QuoteStyle;
  readonly names: readonly string[];
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
}

/**
 * Checks the options of an export of a map (or a map by group) of `method` on d columns and settles them.
 * @throws RemapError for entropic or pairs (saying what to do instead), gradient-net inverted, a bad direction, a column list
 *   of the wrong length, a map without column names and no list, or a suffix with a line break.
 */
export function exportFrame(method: string, d: number, columns: readonly string[] | null, options: SqlOptions): ExportFrame {
  const direction = options.direction ?? 'apply';
  const fn = `SQL export (${method})`;
  if (method === 'entropic' || method === 'pairs') {
    throw new RemapError(
      `${fn}: a${method === 'entropic' ? 'n entropic' : ' pairs'} map cannot be written as SQL, since applying it needs every fitted row (${method === 'entropic' ? 'a weighted sum over the target sample' : 'a look-up of the matched rows'}); apply it with \`remap apply\`, or fit a gradient-net map (which SQL export writes as arithmetic) or a linear map to the same data and export that.`,
    );
  }
  if (direction === 'invert' && method === 'gradient-net') {
    throw new RemapError(
      `${fn}: the inverse of a gradient-net map has no closed form (the engine solves for it by Newton's method), so it cannot be written as SQL; invert with \`remap invert\`, or fit the map the other way (target to source) and export that.`,
    );
  }
  if (direction !== 'apply' && direction !== 'invert') throw new RemapError(`${fn}: the direction must be apply or invert, not "${String(direction)}".`);
  const style: QuoteStyle = options.quote ?? 'double';
  const names = options.columns ?? columns;
  if (!names) throw new RemapError(`${fn}: the map was fitted without column names; give the table's columns to map (${d} of them), in the map's order.`);
  if (names.length !== d) {
    throw new RemapError(
      `${fn}: ${names.length} column${names.length === 1 ? ' was' : 's were'} given (${names.join(', ')}) but the map takes ${d}; give ${d}, in the map's order${columns ? ` (${columns.join(', ')})` : ''}.`,
    );
  }
  const suffix = options.suffix ?? '_mapped';
  if (/[\r\n]/.test(suffix)) throw new RemapError(`${fn}: the suffix ${JSON.stringify(suffix)} holds a line break; give a plain word such as _mapped.`);
  const inputs = names.map((c) => `CAST(t.${sqlName(c, style)} AS DOUBLE)`);
  return { direction, style, names, inputs, outputs: names.map((c) => c + suffix) };
}

/** `[WITH tables] SELECT t.*, expressions AS outputs FROM table AS t [joins]`. O(text). */
export function selectText(f: ExportFrame, table: string, expressions: readonly string[], ctes: readonly string[], joins: readonly string[]): MapSql {
  const { outputs, style } = f;
  const lines = expressions.map((e, k) => `  ${e} AS ${sqlName(outputs[k], style)}`);
  const withClause = ctes.length > 0 ? `WITH ${ctes.join(',\n')}\n` : '';
  const joinText = joins.map((j) => '\n' + j).join('');
  const select = `${withClause}SELECT t.*,\n${lines.join(',\n')}\nFROM ${sqlName(table, style, true)} AS t${joinText}`;
  return { select, outputs: [...outputs] };
}

/** A map's result columns as SQL expressions, with the tables (for a WITH clause) and joins they need. */
export interface MapExpressions {
  readonly expressions: string[];
  readonly ctes: string[];
  readonly joins: string[];
}

/**
 * The SQL expressions of one map (quantile, step, ordinal, linear, gradient-net; checked by the caller) at the given
 * inputs, one per column, with the WITH tables and joins its knot maps need, named `<id>_c<k>_g` and `<id>_c<k>_s`.
 * O(size of the map).
 * @example mapExpressions(linearJson, ['x0', 'x1'], ['a', 'b'], 'apply', 'remap').expressions[0] // '<m2_0> + (<a00> * (x0 - <m1_0>) + ...)'
 */
export function mapExpressions(json: MapJSON, inputs: readonly string[], names: readonly string[], direction: 'apply' | 'invert', id: string): MapExpressions {
  const tails = json.settings.tails === 'linear' ? 'linear' : 'clamp';
  const ctes: string[] = [];
  const joins: string[] = [];
  let expressions: string[];
  switch (json.method) {
    case 'quantile':
    case 'step':
    case 'ordinal': {
      const cols = (json.params as { columns: Record<string, number[]>[] }).columns;
      expressions = cols.map((p, k) => {
        const part = knotSql(knotTable(json.method, p, direction), inputs[k], tails, `${id}_c${k}`, `column ${names[k]}`);
        ctes.push(...part.ctes);
        joins.push(...part.joins);
        return part.expression;
      });
      break;
    }
    case 'linear': {
      const p = json.params as Record<string, number[]>;
      expressions = direction === 'apply' ? affineSQL(inputs, p.mean1, p.matrix, p.mean2) : affineSQL(inputs, p.mean2, p.inverse, p.mean1);
      break;
    }
    case 'gradient-net': {
      const p = json.params as { network: NetworkJSON; source: FrameJSON; target: FrameJSON };
      expressions = networkSQL(p.network, p.source, p.target, inputs, tails !== 'linear');
      break;
    }
    default:
      throw new RemapError(`SQL export (${json.method}): this method cannot be written as SQL; apply the map with \`remap apply\`.`);
  }
  return { expressions, ctes, joins };
}

/** One direction of a saved 1-D column, in the terms of `knotSQL` (the same knots and range the engine's OneWayMap holds). */
export function knotTable(method: string, p: Record<string, number[]>, direction: 'apply' | 'invert'): KnotTable {
  const fwd = direction === 'apply';
  switch (method) {
    case 'quantile':
      return fwd
        ? { keys: p.xs, vals: p.ys, kind: 'linear', lo: p.source[0], hi: p.source[1] }
        : { keys: p.ys, vals: p.xs, kind: 'linear', lo: p.target[0], hi: p.target[1] };
    case 'step': {
      const keys = fwd ? p.source : p.target;
      return { keys, vals: fwd ? p.toTarget : p.toSource, kind: 'step', lo: keys[0], hi: keys[keys.length - 1] };
    }
    default: {
      const keys = fwd ? p.xs : p.inverseYs;
      return { keys, vals: fwd ? p.ys : p.inverseXs, kind: 'linear', lo: keys[0], hi: keys[keys.length - 1] };
    }
  }
}

/** to + M (x - from), each output summed over k in order as affineApply sums it. O(d^2) text. */
function affineSQL(inputs: readonly string[], from: readonly number[], matrix: readonly number[], to: readonly number[]): string[] {
  return affineTerms(inputs, from.map(sqlNumber), Array.from(matrix, sqlNumber), to.map(sqlNumber));
}

/**
 * to_l + (M_l0 (x_0 - from_0) + M_l1 (x_1 - from_1) + ...) for each l, with each coefficient given as SQL (a literal,
 * or a column of a joined table for a map by group): the sums in affineApply's order. O(d^2) text.
 */
export function affineTerms(inputs: readonly string[], from: readonly string[], matrix: readonly string[], to: readonly string[]): string[] {
  const d = inputs.length;
  const diff = inputs.map((x, k) => `(${x} - ${from[k]})`);
  const out: string[] = [];
  for (let l = 0; l < d; l++) {
    let s = `${matrix[l * d]} * ${diff[0]}`;
    for (let k = 1; k < d; k++) s = `${s} + ${matrix[l * d + k]} * ${diff[k]}`;
    out.push(`${to[l]} + (${s})`);
  }
  return out;
}

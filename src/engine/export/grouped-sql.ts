import { RemapError } from '../errors';
import { checkGroupedMapJSON } from '../groups/grouped-json';
import type { GroupedMapJSON } from '../groups/grouped-map';
import type { MapJSON } from '../map';
import { restoreMap } from '../methods';
import { bucketSql, cellJoin, insideSql, knotHead, knotParts } from './knot-sql';
import { affineTerms, exportFrame, knotTable, mapExpressions, selectText, type MapSql, type SqlOptions } from './map-sql';
import { networkSQL, type FrameJSON, type NetworkJSON } from './network-sql';
import { sqlName, sqlNumber } from './sql-text';

/** How to write a map by group as SQL: the options of one map, and the table's column holding each row's group. */
export interface GroupedSqlOptions extends SqlOptions {
  readonly groupColumn: string;
}

/**
 * Writes a map by group (`remap fit-groups`, REMAP.FITGROUPS) as SQL that maps each row by its own group's map, for
 * DuckDB, Spark SQL and Trino alike.
 * - The group is the table's group column as text, trimmed (TRIM(CAST(g AS VARCHAR)); STRING for Spark), matched
 *   with the group names the map keeps, which are text trimmed or numbers in JavaScript's shortest form: a numeric
 *   group column should hold whole numbers (an integer type) or text, since CAST(3.0 AS VARCHAR) is '3.0'.
 * - quantile, step, ordinal: per column, the knot tables of every group stacked in three small tables (the groups'
 *   ends and grids, their buckets, their segments) joined on the group and on numbers computed from the value, as
 *   `knotSql` does for one map: three joins per column whatever the number of groups, O(1) work per row.
 * - linear: one table of every group's means and matrix, joined on the group: O(d^2) per row.
 * - gradient-net: a CASE over the groups, each with its network's arithmetic (text grows with the groups).
 * - Rows of a group the map does not know, and groups the pooled map stands in for, get the pooled map's value when
 *   the map has one (fallback pooled), else NULL (the engine refuses such rows with an error; SQL cannot).
 * A NULL value gives NULL. Results agree with the engine's apply to rounding, as `mapToSql`'s do.
 * Cost: O(size of the map) time and text.
 * @throws RemapError as mapToSql does (entropic and pairs refused, saying what to do instead), and for a missing group column.
 * @example groupedMapToSql(json, { table: 'wave2', groupColumn: 'region' }).select
 *   // 'WITH remap_c0_p AS (...), ...\nSELECT t.*,\n  CASE WHEN ... END AS income_mapped\nFROM wave2 AS t\nLEFT JOIN remap_c0_p ON ...'
 */
export function groupedMapToSql(json: GroupedMapJSON, options: GroupedSqlOptions): MapSql {
  const f = exportFrame(json.method, json.d, json.columns, options);
  checkGroupedMapJSON(json);
  // Every parameter is checked by its method's own reader before any is written out.
  for (const m of [...json.groups.map((g) => g.map), json.pooled]) if (m) restoreMap(m).dispose();
  if (typeof options.groupColumn !== 'string' || options.groupColumn.trim() === '') {
    throw new RemapError(`SQL export (${json.method}, by group): name the table's column holding each row's group (--group-column).`);
  }
  const text = f.style === 'backtick' ? 'STRING' : 'VARCHAR';
  const group = `TRIM(CAST(t.${sqlName(options.groupColumn, f.style)} AS ${text}))`;
  const own = json.groups.filter((g): g is typeof g & { map: MapJSON } => g.map !== null);
  const ctes: string[] = [];
  const joins: string[] = [];
  // The pooled map, for rows of groups without a map of their own.
  let fallback: string[] = Array.from({ length: json.d }, () => 'NULL');
  if (json.pooled) {
    const p = mapExpressions(json.pooled, f.inputs, f.names, f.direction, 'remap_all');
    fallback = p.expressions;
    ctes.push(...p.ctes);
    joins.push(...p.joins);
  }
  let expressions: string[];
  if (own.length === 0) expressions = fallback;
  else if (json.method === 'quantile' || json.method === 'step' || json.method === 'ordinal') {
    expressions = f.inputs.map((x, k) => {
      const part = stackedKnots(own, json.method, k, x, f.direction, json.settings.tails === 'linear' ? 'linear' : 'clamp', `remap_c${k}`, group, f.names[k]);
      ctes.push(...part.ctes);
      joins.push(...part.joins);
      return part.expression(fallback[k]);
    });
  } else if (json.method === 'linear') {
    const part = stackedLinear(own, f.inputs, f.direction, group);
    ctes.push(...part.ctes);
    joins.push(...part.joins);
    expressions = part.expressions.map((e, k) => `CASE WHEN remap_p.grp IS NULL THEN ${fallback[k]} ELSE ${e} END`);
  } else if (json.method === 'gradient-net') {
    const each = own.map((g) => {
      const p = g.map.params as { network: NetworkJSON; source: FrameJSON; target: FrameJSON };
      return networkSQL(p.network, p.source, p.target, f.inputs, g.map.settings.tails !== 'linear');
    });
    expressions = f.inputs.map((_, k) => `CASE ${group} ${own.map((g, i) => `WHEN ${sqlText(g.group)} THEN ${each[i][k]}`).join(' ')} ELSE ${fallback[k]} END`);
  } else throw new RemapError(`SQL export (${json.method}, by group): this method cannot be written as SQL; apply the map with \`remap apply-groups\`.`);
  return selectText(f, options.table, expressions, ctes, joins);
}

/** A text literal: single quotes, doubled inside. */
function sqlText(s: string): string {
  return `'${s.split("'").join("''")}'`;
}

/**
 * Column k of every group's 1-D map as three stacked tables: `<id>_p` (each group's ends, tails and level-1 grid),
 * `<id>_g` (the buckets) and `<id>_s` (the segments), each row led by its group. The expression takes the fallback
 * for rows whose group has no row in `<id>_p`.
 */
function stackedKnots(
  groups: readonly { group: string; map: MapJSON }[],
  method: string,
  k: number,
  x: string,
  direction: 'apply' | 'invert',
  tails: 'clamp' | 'linear',
  id: string,
  group: string,
  name: string,
): { ctes: string[]; joins: string[]; expression: (fallback: string) => string } {
  const n = sqlNumber;
  const heads: string[] = [];
  const grid: string[] = [];
  const cells: string[] = [];
  for (const g of groups) {
    const params = (g.map.params as { columns: Record<string, number[]>[] }).columns[k];
    const t = knotTable(method, params, direction);
    const parts = knotParts(t, `group ${g.group}, column ${name}`);
    const key = sqlText(g.group);
    heads.push(
      `(${key}, ${n(parts.lo)}, ${n(parts.hi)}, ${n(parts.k0)}, ${n(parts.kEnd)}, ${n(parts.scale)}, ${parts.buckets - 1}, ` +
        `${n(parts.first)}, ${n(parts.last)}, ${n(parts.slopeLo)}, ${n(parts.slopeHi)})`,
    );
    for (const r of parts.grid) grid.push(`(${key}, ${r[0]}, ${n(r[1])}, ${n(r[2])}, ${r[3]}, ${r[4]})`);
    for (const r of parts.cells) cells.push(`(${key}, ${r[0]}, ${n(r[1])}, ${n(r[2])}, ${n(r[3])}, ${n(r[4])})`);
  }
  const p = `${id}_p`;
  const g = `${id}_g`;
  const c = `${id}_s`;
  const ctes = [`${p} AS (SELECT * FROM (VALUES\n    ${heads.join(',\n    ')}) AS v(grp, lo, hi, k0, k1, scale, qmax, y_first, y_last, slope_lo, slope_hi))`];
  const joins = [`LEFT JOIN ${p} ON ${p}.grp = ${group}`];
  const col = (c: string): string => `${p}.${c}`;
  const v = {
    lo: col('lo'),
    hi: col('hi'),
    k0: col('k0'),
    kEnd: col('k1'),
    first: col('y_first'),
    last: col('y_last'),
    slopeLo: col('slope_lo'),
    slopeHi: col('slope_hi'),
    qmax: col('qmax'),
    scale: col('scale'),
  };
  let inside = `${p}.y_first`;
  if (grid.length > 0) {
    ctes.push(
      `${g} AS (SELECT * FROM (VALUES\n    ${grid.join(',\n    ')}) AS v(grp, q, start, scale, base, m))`,
      `${c} AS (SELECT * FROM (VALUES\n    ${cells.join(',\n    ')}) AS v(grp, cell, x0, x1, y0, y1))`,
    );
    joins.push(`LEFT JOIN ${g} ON ${g}.grp = ${p}.grp AND ${g}.q = ${bucketSql(x, v)}`, `LEFT JOIN ${c} ON ${c}.grp = ${p}.grp AND ${cellJoin(c, g, x)}`);
    inside = insideSql(method === 'step' ? 'step' : 'linear', c, x);
  }
  const expression = (fallback: string): string => `${knotHead(x, v, tails, `WHEN ${p}.grp IS NULL THEN ${fallback} `)} ELSE ${inside} END`;
  return { ctes, joins, expression };
}

/** Every group's linear map in one table `remap_p` (from_k, a_l_k, to_l), and its d expressions. */
function stackedLinear(
  groups: readonly { group: string; map: MapJSON }[],
  inputs: readonly string[],
  direction: 'apply' | 'invert',
  group: string,
): { ctes: string[]; joins: string[]; expressions: string[] } {
  const d = inputs.length;
  const n = sqlNumber;
  const rows = groups.map((g) => {
    const p = g.map.params as Record<string, number[]>;
    const [from, matrix, to] = direction === 'apply' ? [p.mean1, p.matrix, p.mean2] : [p.mean2, p.inverse, p.mean1];
    return `(${sqlText(g.group)}, ${[...from, ...matrix, ...to].map(n).join(', ')})`;
  });
  const fromCols = Array.from({ length: d }, (_, k) => `f${k}`);
  const matrixCols = Array.from({ length: d * d }, (_, i) => `a${Math.floor(i / d)}_${i % d}`);
  const toCols = Array.from({ length: d }, (_, k) => `m${k}`);
  const ctes = [`remap_p AS (SELECT * FROM (VALUES\n    ${rows.join(',\n    ')}) AS v(grp, ${[...fromCols, ...matrixCols, ...toCols].join(', ')}))`];
  const joins = [`LEFT JOIN remap_p ON remap_p.grp = ${group}`];
  const col = (c: string): string => `remap_p.${c}`;
  const expressions = affineTerms(inputs, fromCols.map(col), matrixCols.map(col), toCols.map(col));
  return { ctes, joins, expressions };
}

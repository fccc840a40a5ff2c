import { RemapError } from '../errors';

/**
 * Pieces of SQL text that DuckDB, Spark SQL and Trino read alike.
 *
 * Numbers: a literal such as 0.1 is a DECIMAL in all three engines (exact,
 * with at most 38 digits), and arithmetic mixing it with a DOUBLE column can
 * round differently from JavaScript or overflow the decimal. A literal with an
 * exponent (1E-1) is a DOUBLE in all three, so every number is written that
 * way, in JavaScript's shortest form that reads back to the same double.
 */

/**
 * A double as a SQL DOUBLE literal, bracketed when negative (so that `x - (-1E0)`
 * never becomes the comment `--`). O(1).
 * @throws RemapError for a number that is not finite (SQL has no literal for it).
 * @example sqlNumber(0.1) // '1E-1'
 * @example sqlNumber(-2.5) // '(-2.5E0)'
 */
export function sqlNumber(v: number): string {
  if (!Number.isFinite(v)) throw new RemapError(`SQL export: the map holds the number ${v}, which SQL cannot write; fit the map again.`);
  const t = (v === 0 ? 0 : v).toExponential().toUpperCase().replace('E+', 'E');
  return v < 0 ? `(${t})` : t;
}

/**
 * Words that cannot stand unquoted as a column or table name in at least one of the three engines
 * (common practice: the SQL-92 and engines' reserved lists, abridged).
 */
const RESERVED = new Set(
  (
    'all and any array as asc between both by case cast check collate column constraint create cross cube current current_date current_time ' +
    'current_timestamp current_user default delete desc describe distinct drop else end escape except exists extract false fetch filter for ' +
    'foreign from full grant group grouping having in inner insert intersect interval into is join lateral leading left like limit localtime ' +
    'localtimestamp natural normalize not null of offset on only or order outer over partition primary range recursive references right ' +
    'rollup row rows select some table tablesample then to trailing true uescape union unique unknown unnest update user using values when where window with'
  ).split(' '),
);

/** How names are quoted: double quotes (SQL standard: DuckDB, Trino) or backticks (Spark SQL). */
export type QuoteStyle = 'double' | 'backtick';

/**
 * A column or table name as SQL: left bare when it is a plain lower-case word
 * that no engine reserves (so one text runs everywhere), else quoted in `style`.
 * A dotted name (schema.table) is quoted part by part. O(length).
 * @throws RemapError for an empty name or one holding the quote character of `style` together with a line break.
 * @example sqlName('income') // 'income'
 * @example sqlName('Net income') // '"Net income"'
 */
export function sqlName(name: string, style: QuoteStyle = 'double', dotted = false): string {
  if (dotted && name.includes('.'))
    return name
      .split('.')
      .map((p) => sqlName(p, style, false))
      .join('.');
  if (name === '') throw new RemapError('SQL export: a column or table name is empty; give a name.');
  if (/^[a-z_][a-z0-9_]*$/.test(name) && !RESERVED.has(name)) return name;
  const q = style === 'double' ? '"' : '`';
  // A NUL byte in a name is refused, like a line break: the regular expression names it on purpose.
  // eslint-disable-next-line no-control-regex
  if (/[\r\n\u0000]/.test(name)) throw new RemapError(`SQL export: the name ${JSON.stringify(name)} holds a line break; rename the column.`);
  return q + name.split(q).join(q + q) + q;
}

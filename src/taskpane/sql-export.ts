import { RemapError } from '../engine/errors';
import { mapToSql } from '../engine/export/map-sql';
import { isGroupedMapJSON } from '../engine/groups/grouped-json';
import { parseMapJSON } from '../engine/map-json';

/**
 * A kept map as SQL for the pane's "Copy SQL" and "Save SQL": the defaults the
 * pane offers for the table and its columns, and the statement the engine's
 * SQL export writes (`mapToSql`; DuckDB, Spark SQL and Trino). Pure (no DOM).
 */

/** The table name offered when nothing better is known (design choice: a plain placeholder the user overwrites). */
export const DEFAULT_SQL_TABLE = 'source_rows';

/** What the pane fills in before the user asks for SQL: a table name and the columns to map, comma-separated. */
export interface SqlDefaults {
  readonly table: string;
  readonly columns: string;
}

/**
 * The defaults for a map's SQL: the map's own column names (the source's header
 * when it was fitted), else x1..xd; the table `DEFAULT_SQL_TABLE`. O(d).
 * Text that is no single map (a map by group, damaged JSON) gets x1 and the
 * table, and `mapSqlText` then says what is wrong.
 * @example sqlDefaults(quantileJsonFittedOnIncome) // { table: 'source_rows', columns: 'income' }
 */
export function sqlDefaults(jsonText: string): SqlDefaults {
  try {
    const m = parseMapJSON(jsonText);
    const names = m.columns ?? Array.from({ length: m.d }, (_, k) => `x${k + 1}`);
    return { table: DEFAULT_SQL_TABLE, columns: names.join(', ') };
  } catch {
    return { table: DEFAULT_SQL_TABLE, columns: 'x1' };
  }
}

/**
 * The SQL applying a kept map to `table`'s columns (comma-separated, in the
 * map's order), ending with a semicolon and a line break. O(size of the map).
 * @throws RemapError for an empty table name or column, a map by group (not
 *   exported as SQL), and whatever the engine's export refuses (entropic and
 *   pairs maps, saying what to do instead; a column count that does not match).
 * @example mapSqlText(json, 'wave2', 'income').startsWith('WITH') // true for a 1-D map
 */
export function mapSqlText(jsonText: string, table: string, columnsText: string): string {
  const t = table.trim();
  if (t === '') throw new RemapError('Copy SQL: the table name is empty; give the table (or view) that holds the rows to map, e.g. wave2.');
  const columns = columnsText.split(',').map((c) => c.trim());
  if (columns.some((c) => c === '')) {
    throw new RemapError(
      `Copy SQL: the columns "${columnsText}" hold an empty name; give the table's columns to map, separated by commas, in the map's order.`,
    );
  }
  let grouped = false;
  try {
    grouped = isGroupedMapJSON(JSON.parse(jsonText));
  } catch {
    grouped = false; // parseMapJSON below says what is wrong
  }
  if (grouped) {
    throw new RemapError(
      'Copy SQL: a map by group is not written as SQL by this version; apply it with `remap apply-groups`, or fit each group with REMAP.FIT on its own rows and export those maps.',
    );
  }
  return `${mapToSql(parseMapJSON(jsonText), { table: t, columns }).select};\n`;
}

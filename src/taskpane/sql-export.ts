import { RemapError } from '../engine/errors';
import { groupedMapToSql } from '../engine/export/grouped-sql';
import { mapToSql } from '../engine/export/map-sql';
import { isGroupedMapJSON, parseGroupedMapJSON } from '../engine/groups/grouped-json';
import { parseMapJSON } from '../engine/map-json';

/**
 * A kept map as SQL for the pane's "Copy SQL" and "Save SQL": the defaults the
 * pane offers for the table and its columns, and the statement the engine's
 * SQL export writes (`mapToSql`; DuckDB, Spark SQL and Trino). Pure (no DOM).
 */

/** The table name offered when nothing better is known (design choice: a plain placeholder the user overwrites). */
export const DEFAULT_SQL_TABLE = 'source_rows';

/** The group column offered for a map by group (design choice: a placeholder the user overwrites). */
export const DEFAULT_SQL_GROUP_COLUMN = 'group_name';

/** What the pane fills in before the user asks for SQL: a table name, the columns to map (comma-separated), and for a map by group its group column. */
export interface SqlDefaults {
  readonly table: string;
  readonly columns: string;
  /** The column holding each row's group: a map by group only (null otherwise). */
  readonly groupColumn: string | null;
}

/** Whether map JSON text is a map by group (false for anything else, damaged text included). */
function isGrouped(jsonText: string): boolean {
  try {
    return isGroupedMapJSON(JSON.parse(jsonText));
  } catch {
    return false; // the readers below say what is wrong
  }
}

/**
 * The defaults for a map's SQL: the map's own column names (the source's header
 * when it was fitted), else x1..xd; the table `DEFAULT_SQL_TABLE`. O(d).
 * A map by group also gets the group column `DEFAULT_SQL_GROUP_COLUMN`. Damaged
 * JSON gets x1 and the table, and `mapSqlText` then says what is wrong.
 * @example sqlDefaults(quantileJsonFittedOnIncome) // { table: 'source_rows', columns: 'income', groupColumn: null }
 */
export function sqlDefaults(jsonText: string): SqlDefaults {
  try {
    const grouped = isGrouped(jsonText);
    const m = grouped ? parseGroupedMapJSON(jsonText) : parseMapJSON(jsonText);
    const names = m.columns ?? Array.from({ length: m.d }, (_, k) => `x${k + 1}`);
    return { table: DEFAULT_SQL_TABLE, columns: names.join(', '), groupColumn: grouped ? DEFAULT_SQL_GROUP_COLUMN : null };
  } catch {
    return { table: DEFAULT_SQL_TABLE, columns: 'x1', groupColumn: null };
  }
}

/**
 * The SQL applying a kept map to `table`'s columns (comma-separated, in the
 * map's order), ending with a semicolon and a line break; a map by group maps
 * each row by the map of the group in `groupColumn`. O(size of the map).
 * @throws RemapError for an empty table name, column or group column (a map by
 *   group), and whatever the engine's export refuses (entropic and pairs maps,
 *   saying what to do instead; a column count that does not match).
 * @example mapSqlText(json, 'wave2', 'income').startsWith('WITH') // true for a 1-D map
 */
export function mapSqlText(jsonText: string, table: string, columnsText: string, groupColumn = ''): string {
  const t = table.trim();
  if (t === '') throw new RemapError('Copy SQL: the table name is empty; give the table (or view) that holds the rows to map, e.g. wave2.');
  const columns = columnsText.split(',').map((c) => c.trim());
  if (columns.some((c) => c === '')) {
    throw new RemapError(
      `Copy SQL: the columns "${columnsText}" hold an empty name; give the table's columns to map, separated by commas, in the map's order.`,
    );
  }
  if (isGrouped(jsonText)) {
    const g = groupColumn.trim();
    if (g === '') throw new RemapError("Copy SQL: the group column is empty; give the table's column that holds each row's group, e.g. region.");
    return `${groupedMapToSql(parseGroupedMapJSON(jsonText), { table: t, columns, groupColumn: g }).select};\n`;
  }
  return `${mapToSql(parseMapJSON(jsonText), { table: t, columns }).select};\n`;
}

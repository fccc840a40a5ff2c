import { fitGroupedMapSync } from '../../src/engine/groups/fit-grouped';
import { fitMapSync } from '../../src/engine/methods';
import { DEFAULT_SQL_GROUP_COLUMN, DEFAULT_SQL_TABLE, mapSqlText, sqlDefaults } from '../../src/taskpane/sql-export';

const sample = (xs: number[]) => ({ n: xs.length, d: 1, data: Float64Array.from(xs), weights: null });
const sample2 = (rows: number[][]) => ({ n: rows.length, d: 2, data: Float64Array.from(rows.flat()), weights: null });
const xs = Array.from({ length: 40 }, (_, i) => i);
const quantileJson = (columns?: string[]) =>
  JSON.stringify(fitMapSync('quantile', sample(xs), sample(xs.map((x) => 2 * x + 1)), {}, columns ? { columns } : {}).toJSON());

describe("the pane's Copy SQL and Save SQL", () => {
  test("the columns offered are the map's own column names; without names, x1..xd", () => {
    // Source: design choice: the defaults the pane fills in before the user edits them
    expect(sqlDefaults(quantileJson(['income']))).toEqual({ table: DEFAULT_SQL_TABLE, columns: 'income', groupColumn: null });
    const rows = xs.map((x) => [x, (x * 7) % 11]);
    const linear = JSON.stringify(fitMapSync('linear', sample2(rows), sample2(rows.map(([a, b]) => [a + 1, b * 2])), {}).toJSON());
    expect(sqlDefaults(linear)).toEqual({ table: DEFAULT_SQL_TABLE, columns: 'x1, x2', groupColumn: null });
  });

  test('the SQL selects from the table given and names the mapped column after the column given; one statement, ending with ;', () => {
    const sql = mapSqlText(quantileJson(['income']), ' survey.wave2 ', 'pay');
    // Source: design choice of the engine's SQL export: SELECT t.*, <expr> AS <column>_mapped FROM <table> AS t
    expect(sql).toMatch(/SELECT t\.\*,\n/);
    expect(sql).toContain('AS pay_mapped');
    expect(sql).toContain('FROM survey.wave2 AS t');
    expect(sql.endsWith(';\n')).toBe(true);
  });

  test("an entropic map is refused with the engine's text saying what to do instead; so are an empty table and a wrong column count", () => {
    const rows = xs.slice(0, 20).map((x) => [x, (x * 7) % 11]);
    const entropic = JSON.stringify(fitMapSync('entropic', sample2(rows), sample2(rows.map(([a, b]) => [a + 1, b * 2])), { seed: 1 }).toJSON());
    // Source: the engine's refusal (mapToSql): entropic maps need every fitted row at apply time
    expect(() => mapSqlText(entropic, 't', 'a, b')).toThrow(/cannot be written as SQL.*fit a gradient-net map/);
    expect(() => mapSqlText(quantileJson(), '  ', 'a')).toThrow(/table name is empty/);
    expect(() => mapSqlText(quantileJson(), 't', 'a, b')).toThrow(/2 columns were given \(a, b\) but the map takes 1/);
    expect(() => mapSqlText(quantileJson(), 't', 'a,,b')).toThrow(/empty name/);
  });

  test('a map by group: the group column offered and required, then SQL that joins each group to its own knots', () => {
    const g = fitGroupedMapSync(
      'quantile',
      sample(xs),
      xs.map((x) => (x < 20 ? 'a' : 'b')),
      sample(xs),
      xs.map((x) => (x < 20 ? 'a' : 'b')),
    );
    const json = JSON.stringify(g.toJSON());
    // Source: design choice: a map by group gets a placeholder group column; a single map none.
    expect(sqlDefaults(json)).toEqual({ table: DEFAULT_SQL_TABLE, columns: 'x1', groupColumn: DEFAULT_SQL_GROUP_COLUMN });
    expect(sqlDefaults(quantileJson(['income'])).groupColumn).toBeNull();
    expect(() => mapSqlText(json, 't', 'a', ' ')).toThrow(/group column is empty/);
    const sql = mapSqlText(json, 't', 'a', 'region');
    // Source: design choice: the group is the table's column as trimmed text, joined to the stacked tables of the groups.
    expect(sql).toContain('LEFT JOIN remap_c0_p ON remap_c0_p.grp = TRIM(CAST(t.region AS VARCHAR))');
    expect(sql).toMatch(/\('a', .*\),\n\s+\('b', /);
  });
});

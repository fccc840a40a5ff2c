import type { DuckDBConnection } from '@duckdb/node-api';

/** Columns of numbers read from a DuckDB query: names and one Float64Array per column (NULL read as NaN). */
export interface DoubleColumns {
  readonly names: string[];
  readonly columns: Float64Array[];
  readonly rows: number;
  /** Per column, how many values were NULL. */
  readonly nulls: number[];
}

/**
 * Runs `sql` and reads every result column as doubles, chunk by chunk, straight
 * into growing Float64Arrays (no per-value JavaScript objects). The query must
 * give DOUBLE columns: cast them (`CAST(x AS DOUBLE)`) when unsure.
 * Cost: O(rows x columns).
 * @throws the engine's own error for bad SQL, or an Error naming a column that is not DOUBLE.
 * @example await readDoubleColumns(conn, 'SELECT CAST(a AS DOUBLE) AS a FROM t') // { names: ['a'], columns: [Float64Array [...]], ... }
 */
export async function readDoubleColumns(conn: DuckDBConnection, sql: string): Promise<DoubleColumns> {
  const result = await conn.stream(sql);
  const names = result.columnNames();
  const types = result.columnTypes();
  const d = names.length;
  types.forEach((t, k) => {
    if (t.toString() !== 'DOUBLE') throw new Error(`column "${names[k]}" is ${t.toString()}, not DOUBLE; cast it with CAST(... AS DOUBLE).`);
  });
  let cap = 1 << 16;
  let columns = names.map(() => new Float64Array(cap));
  const nulls = names.map(() => 0);
  let rows = 0;
  for (;;) {
    const chunk = await result.fetchChunk();
    if (!chunk || chunk.rowCount === 0) break;
    const m = chunk.rowCount;
    if (rows + m > cap) {
      while (rows + m > cap) cap *= 2;
      columns = columns.map((c) => {
        const g = new Float64Array(cap);
        g.set(c.subarray(0, rows));
        return g;
      });
    }
    for (let k = 0; k < d; k++) {
      const vec = chunk.getColumnVector(k);
      const out = columns[k];
      for (let i = 0; i < m; i++) {
        const v = vec.getItem(i) as number | null;
        if (v === null) {
          out[rows + i] = NaN;
          nulls[k]++;
        } else out[rows + i] = v;
      }
    }
    rows += m;
  }
  return { names, columns: columns.map((c) => c.slice(0, rows)), rows, nulls };
}

import { RemapError } from '../engine/errors';
import { groupedMapToSql } from '../engine/export/grouped-sql';
import { mapToSql } from '../engine/export/map-sql';
import { isGroupedMapJSON, parseGroupedMapJSON } from '../engine/groups/grouped-json';
import { fitLinearFromMoments } from '../engine/linear/from-moments';
import { parseMapJSON } from '../engine/map-json';
import { parseSettingsText } from '../engine/settings';
import { formatCSV } from './csv';
import { describeDialect, detectDialect, detectDialectBytes, dialectFrom, toStandardCSV, type Dialect } from './dialect';
import { readDoubleColumns } from './duckdb-columns';
import { readMomentsCSV } from './moments-csv';

/** The input and output the command uses (the same shape as main's CliIO). */
export interface RouteIO {
  readonly stdout: (s: string) => void;
  readonly stderr: (s: string) => void;
  readonly readFile: (path: string) => string;
  readonly writeFile: (path: string, text: string) => void;
  /** A file's bytes, when the caller can give them: CSV is then read from its bytes, without decoding the whole file. */
  readonly readBytes?: (path: string) => Uint8Array;
  /** Opens a file (null: stdout) to write in pieces; without it, the pieces are joined and given to writeFile or stdout. */
  readonly openOut?: (path: string | null) => OutFile;
  /** Set by `route`: a CSV input's UTF-8 bytes and how it is written, for the typed-array reader. */
  readonly readInput?: (path: string) => CsvInput | undefined;
}

/** A file open for writing in pieces. */
export interface OutFile {
  readonly write: (chunk: Uint8Array) => void;
  readonly close: () => void;
}

/** A CSV input as read: its UTF-8 bytes and its dialect. */
export interface CsvInput {
  readonly bytes: Uint8Array;
  readonly dialect: Dialect;
}

/** A lone UTF-16 surrogate: such text has no UTF-8 bytes that read back the same. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Options of the commands this module adds or extends. */
export const SQL_FLAGS = ['model', 'table', 'columns', 'group-column', 'direction', 'suffix', 'quote', 'out'];
export const SQL_SUMMARY =
  'remap sql --model model.json --table T [--columns a,b] [--group-column G (a map by group)] [--direction apply|invert] [--suffix _mapped] [--quote double|backtick] [--out map.sql]';
export const DIALECT_FLAGS = ['delimiter', 'decimal'];
export const MOMENT_FLAGS = ['source-moments', 'target-moments'];

/**
 * What the command does before its CSV commands run: the `sql` command, fits
 * from summaries (--source-moments, --target-moments), and reading inputs of
 * other kinds: Parquet files (through DuckDB) and CSV of other dialects
 * (semicolons, tabs, decimal commas), each rewritten as the plain CSV the
 * commands read, with one line on stderr saying how it was read.
 * Returns the exit code when the command is done here, else the IO the
 * CSV commands should use.
 */
export async function route(command: string, flags: Record<string, string>, io: RouteIO): Promise<{ code: number } | { io: RouteIO }> {
  if (command === 'sql') return { code: sqlCommand(flags, io) };
  if ((command === 'fit' || command === 'cost') && (flags['source-moments'] !== undefined || flags['target-moments'] !== undefined)) {
    return { code: fitFromMoments(command, flags, io) };
  }
  const files = ['source', 'target', 'input'].map((f) => flags[f]).filter((p): p is string => p !== undefined && p !== '');
  if (files.length === 0) return { io };
  const cache = new Map<string, string>();
  // Each CSV input is read once, as bytes; the plain CSV text the general reader needs is made from them only when asked for.
  const inputs = new Map<string, { bytes: Uint8Array | null; text: string | null; dialect: Dialect }>();
  for (const path of files) {
    if (cache.has(path) || inputs.has(path)) continue;
    if (/\.parquet$/i.test(path)) {
      cache.set(path, await parquetAsCSV(path));
      io.stderr(`remap: read ${path} as Parquet (through DuckDB).\n`);
      continue;
    }
    let bytes: Uint8Array | null = null;
    let text: string | null = null;
    try {
      if (io.readBytes) bytes = io.readBytes(path);
      else text = io.readFile(path);
    } catch {
      continue; // the command itself reports a file it cannot read
    }
    if (bytes === null && !LONE_SURROGATE.test(text!)) bytes = Buffer.from(text!, 'utf8');
    const dialect = dialectFrom(flags.delimiter, flags.decimal, bytes !== null ? detectDialectBytes(bytes) : detectDialect(text!));
    if (dialect.delimiter !== ',' || flags.delimiter !== undefined || flags.decimal !== undefined)
      io.stderr(`remap: read ${path} as ${describeDialect(dialect)}.\n`);
    inputs.set(path, { bytes, text, dialect });
  }
  const readFile = (p: string): string => {
    const done = cache.get(p);
    if (done !== undefined) return done;
    const input = inputs.get(p);
    if (!input) return io.readFile(p);
    const text = input.text ?? Buffer.from(input.bytes!.buffer, input.bytes!.byteOffset, input.bytes!.byteLength).toString('utf8');
    const standard = toStandardCSV(text, input.dialect, p);
    cache.set(p, standard);
    return standard;
  };
  const readInput = (p: string): CsvInput | undefined => {
    const input = inputs.get(p);
    return input && input.bytes !== null ? { bytes: input.bytes, dialect: input.dialect } : undefined;
  };
  return { io: { ...io, readFile, readInput } };
}

function need(flags: Record<string, string>, name: string, usage: string): string {
  const v = flags[name];
  if (v === undefined || v === '') throw new RemapError(`--${name} is needed; usage: ${usage}`);
  return v;
}

function readText(io: RouteIO, path: string): string {
  try {
    return io.readFile(path);
  } catch (e) {
    throw new RemapError(`cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
  }
}

/** `remap sql`: the map as SQL for DuckDB, Spark SQL and Trino. */
function sqlCommand(flags: Record<string, string>, io: RouteIO): number {
  const modelText = readText(io, need(flags, 'model', SQL_SUMMARY));
  let grouped = false;
  try {
    grouped = isGroupedMapJSON(JSON.parse(modelText));
  } catch {
    grouped = false; // parseMapJSON says what is wrong
  }
  const direction = (flags.direction ?? 'apply').trim().toLowerCase();
  if (direction !== 'apply' && direction !== 'invert') throw new RemapError(`--direction must be apply or invert, not "${flags.direction}".`);
  const quote = (flags.quote ?? 'double').trim().toLowerCase();
  if (quote !== 'double' && quote !== 'backtick') throw new RemapError(`--quote must be double (DuckDB, Trino) or backtick (Spark SQL), not "${flags.quote}".`);
  const columns = flags.columns
    ?.split(',')
    .map((c) => c.trim())
    .filter((c) => c !== '');
  const options = { table: need(flags, 'table', SQL_SUMMARY), columns, direction, suffix: flags.suffix, quote } as const;
  let select: string;
  let what: string;
  if (grouped) {
    const json = parseGroupedMapJSON(modelText);
    if (flags['group-column'] === undefined || flags['group-column'].trim() === '') {
      throw new RemapError(`${flags.model} is a map by group: give the table's column holding each row's group with --group-column. Usage: ${SQL_SUMMARY}`);
    }
    select = groupedMapToSql(json, { ...options, groupColumn: flags['group-column'].trim() }).select;
    what = `${json.method} map by group (${json.groups.length} groups${json.pooled ? ', the pooled map for others' : '; other groups give NULL'})`;
  } else {
    if (flags['group-column'] !== undefined) throw new RemapError(`--group-column is for maps by group; ${flags.model} is a single map.`);
    const json = parseMapJSON(modelText);
    select = mapToSql(json, options).select;
    what = `${json.method} map`;
  }
  const text = `-- remap: ${what}, ${direction === 'apply' ? 'source to target' : 'target to source'}; runs in DuckDB, Spark SQL and Trino.\n${select};\n`;
  if (flags.out) io.writeFile(flags.out, text);
  else io.stdout(text);
  return 0;
}

/** `remap fit|cost --source-moments S.csv --target-moments T.csv`: the linear map from summaries. */
function fitFromMoments(command: string, flags: Record<string, string>, io: RouteIO): number {
  const usage = `remap ${command} --method linear --source-moments S.csv --target-moments T.csv [--settings "ridge=..."]${command === 'fit' ? ' --out model.json' : ''}`;
  const method = (flags.method ?? 'linear').trim().toLowerCase();
  if (method !== 'linear')
    throw new RemapError(`fitting from means and covariances gives the linear map only, not ${method}; give --method linear (or fit from rows).`);
  for (const f of ['source', 'target', 'source-weights', 'target-weights', 'columns']) {
    if (flags[f] !== undefined)
      throw new RemapError(`--${f} does not go with --source-moments and --target-moments; the summaries already say what they summarise. Usage: ${usage}`);
  }
  const read = (flag: string) => {
    const path = need(flags, flag, usage);
    const text = readText(io, path);
    return readMomentsCSV(toStandardCSV(text, dialectFrom(flags.delimiter, flags.decimal, text), path), path);
  };
  const s = read('source-moments');
  const t = read('target-moments');
  if (s.columns.join('\u0000') !== t.columns.join('\u0000')) {
    throw new RemapError(
      `the source summary's columns (${s.columns.join(', ')}) and the target's (${t.columns.join(', ')}) differ; give both the same columns in the same order.`,
    );
  }
  const settings: Record<string, unknown> = flags.settings ? parseSettingsText(flags.settings) : {};
  if (flags.tails !== undefined) settings.tails = flags.tails;
  const map = fitLinearFromMoments(s.moments, t.moments, settings, { columns: s.columns });
  const diag = map.diagnostics();
  if (command === 'cost') {
    io.stdout(
      JSON.stringify(
        {
          method: 'linear',
          w2_squared: diag.cost.w2Squared,
          w2: diag.cost.w2,
          kind: diag.cost.kind,
          note: diag.cost.note,
          d: diag.d,
          warnings: diag.warnings.map((w) => w.message),
        },
        null,
        2,
      ) + '\n',
    );
    return 0;
  }
  const out = need(flags, 'out', usage);
  io.writeFile(out, JSON.stringify(map.toJSON()));
  io.stderr(
    `remap: fitted linear from summaries of ${diag.n.source} x ${diag.n.target} rows, ${diag.d} column${diag.d === 1 ? '' : 's'}; squared W2 ${diag.cost.w2Squared.toPrecision(6)}; wrote ${out}.\n`,
  );
  for (const w of diag.warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
  return 0;
}

/** A Parquet file's columns as plain CSV text: numeric columns as doubles, others left blank (so they are not data columns). */
async function parquetAsCSV(path: string): Promise<string> {
  // Loaded here, not at start: the native library is only needed for Parquet.
  const { DuckDBInstance } = await import('@duckdb/node-api');
  const db = await DuckDBInstance.create(':memory:');
  const conn = await db.connect();
  try {
    const src = `read_parquet('${path.replace(/'/g, "''")}')`;
    let described;
    try {
      described = (await conn.runAndReadAll(`DESCRIBE SELECT * FROM ${src}`)).getRowsJS();
    } catch (e) {
      throw new RemapError(`cannot read ${path} as Parquet (${String((e as Error).message).split('\n')[0]}); check the path and that it is a Parquet file.`);
    }
    const names = described.map((r) => String(r[0]));
    const q = (n: string) => `"${n.replace(/"/g, '""')}"`;
    const cols = await readDoubleColumns(conn, `SELECT ${names.map((n) => `TRY_CAST(${q(n)} AS DOUBLE) AS ${q(n)}`).join(', ')} FROM ${src}`);
    const rows: (string | number | null)[][] = [names];
    for (let i = 0; i < cols.rows; i++) rows.push(cols.columns.map((c) => (Number.isNaN(c[i]) ? null : c[i])));
    return formatCSV(rows);
  } finally {
    conn.closeSync();
  }
}

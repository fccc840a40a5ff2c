import { RemapError, isRemapError } from '../engine/errors';
import { chooseMethod } from '../engine/auto';
import type { Mapped, TransportMap } from '../engine/map';
import { parseMapJSON } from '../engine/map-json';
import { extrapolationWarning } from '../engine/outside';
import { getMethod, listMethods, restoreMap, settingSpecs, startFit } from '../engine/methods';
import { parseSettingsText } from '../engine/settings';
import { CellError, type CellIn } from '../input/cells';
import { readSample, readValues, writeValues, type ReadSample } from '../input/coerce';
import { csvCell, formatCSV, parseCSV } from './csv';
import { scanNumericBytes, scanNumericCSV } from './numeric-csv';
import { mapTable } from './numeric-map-file';
import { sampleFromTable } from './numeric-sample';
import { CommandUsageError, MORE_COMMANDS, runMoreCommand } from './more-commands';
import { estimateRows, mapInParallel, scanInParallel, workerCount } from './parallel/parallel-csv';
import { WorkerPool } from './parallel/pool';
import { DIALECT_FLAGS, MOMENT_FLAGS, route, SQL_FLAGS, SQL_SUMMARY, type RouteIO } from './route';
import type { NumericTable } from './numeric-csv';

/**
 * The `remap` command: CSV in, CSV or JSON out, through the same coercion
 * module and engine as the worksheet functions. `main` returns the exit code so
 * tests can run it in-process; bin/remap.js calls it for the shell.
 * Exit codes: 0 done, 1 bad input or data (one line on stderr), 2 bad usage.
 */

export type CliIO = RouteIO;

class UsageError extends Error {}

const COMMANDS: Record<string, { flags: string[]; summary: string }> = {
  fit: {
    flags: [
      'source',
      'target',
      'method',
      'columns',
      'source-weights',
      'target-weights',
      'settings',
      'seed',
      'tails',
      'out',
      'workers',
      ...MOMENT_FLAGS,
      ...DIALECT_FLAGS,
    ],
    summary:
      'remap fit --source S.csv --target T.csv [--method M] [--columns a,b] [--source-weights COL] [--target-weights COL] [--settings "k=v; ..."] [--seed N] [--tails clamp|linear] [--workers N] --out model.json',
  },
  apply: { flags: ['model', 'input', 'out', 'workers', ...DIALECT_FLAGS], summary: 'remap apply --model model.json --input X.csv [--out Y.csv] [--workers N]' },
  invert: {
    flags: ['model', 'input', 'out', 'workers', ...DIALECT_FLAGS],
    summary: 'remap invert --model model.json --input Y.csv [--out X.csv] [--workers N]',
  },
  cost: {
    flags: [
      'source',
      'target',
      'method',
      'columns',
      'source-weights',
      'target-weights',
      'settings',
      'seed',
      'tails',
      'workers',
      ...MOMENT_FLAGS,
      ...DIALECT_FLAGS,
    ],
    summary: 'remap cost --source S.csv --target T.csv [--method M] [same column, weight and settings options as fit]',
  },
  report: { flags: ['model'], summary: 'remap report --model model.json' },
  methods: { flags: [], summary: 'remap methods' },
  ...MORE_COMMANDS,
  sql: { flags: SQL_FLAGS, summary: SQL_SUMMARY },
};

function usage(): string {
  return [
    'remap: fit a monotone transport map from a source sample to a target sample, apply it, and report its cost.',
    '',
    ...Object.values(COMMANDS).map((c) => '  ' + c.summary),
    '',
    `Methods: ${listMethods()
      .map((m) => m.name)
      .join(', ')}, auto.`,
    'CSV files have a header row; all numeric columns are used unless --columns picks some.',
  ].join('\n');
}

function parseArgs(argv: readonly string[]): { command: string; flags: Record<string, string> } {
  const [command, ...rest] = argv;
  if (!command || command === '--help' || command === '-h' || command === 'help') throw new UsageError('');
  const spec = COMMANDS[command];
  if (!spec) throw new UsageError(`unknown command "${command}"; the commands are ${Object.keys(COMMANDS).join(', ')}.`);
  const flags: Record<string, string> = Object.create(null);
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (!a.startsWith('--')) throw new UsageError(`unexpected "${a}"; write options as --name value.`);
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    if (!spec.flags.includes(name)) {
      throw new UsageError(`${command} has no option --${name}; its options are ${spec.flags.map((f) => '--' + f).join(', ') || '(none)'}.`);
    }
    let value: string;
    if (eq > 0) value = a.slice(eq + 1);
    else {
      if (i + 1 >= rest.length || rest[i + 1].startsWith('--')) throw new UsageError(`--${name} needs a value; give one, as in --${name} value.`);
      value = rest[++i];
    }
    if (name in flags) throw new UsageError(`--${name} is given twice; give it once.`);
    flags[name] = value;
  }
  return { command, flags };
}

function need(flags: Record<string, string>, name: string, command: string): string {
  const v = flags[name];
  if (v === undefined || v === '') throw new UsageError(`${command} needs --${name}; usage: ${COMMANDS[command].summary}`);
  return v;
}

/** A CSV file read as a header and rows of cells. */
interface Table {
  readonly name: string;
  readonly header: string[];
  readonly rows: CellIn[][];
}

function readText(io: CliIO, path: string): string {
  try {
    return io.readFile(path);
  } catch (e) {
    if (isRemapError(e)) throw e; // the file was read, but not as CSV (a quote that never ends)
    throw new RemapError(`cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
  }
}

/** The general reader: every field a cell. The typed-array reader (numeric-csv.ts) reads the usual files; this one words the errors. */
function readTable(path: string, text: string): Table {
  const rows = parseCSV(text, path);
  if (rows.length === 0) throw new RemapError(`${path} is empty; it needs a header row and rows of numbers.`);
  const header = rows[0].map((h) => h.trim());
  const seen = new Set<string>();
  for (const h of header) {
    if (seen.has(h)) throw new RemapError(`${path}: the column name "${h}" appears twice in the header; give each column its own name.`);
    seen.add(h);
  }
  return { name: path, header, rows: rows.slice(1).map((r) => r.map(csvCell)) };
}

function columnIndex(t: Table, col: string, what: string): number {
  const k = t.header.indexOf(col.trim());
  if (k < 0) throw new RemapError(`${t.name} has no column "${col}" (${what}); its columns are ${t.header.join(', ')}; pick one of those.`);
  return k;
}

/** The data columns: those named by --columns, else every column holding numbers and no text (weights excluded). */
function dataColumns(t: Table, columns: string | undefined, exclude: number[]): number[] {
  if (columns !== undefined) {
    const picked = columns
      .split(',')
      .map((c) => c.trim())
      .filter((c) => c !== '');
    if (picked.length === 0) throw new RemapError('--columns names no column; give names separated by commas.');
    return picked.map((c) => columnIndex(t, c, '--columns'));
  }
  const out: number[] = [];
  for (let k = 0; k < t.header.length; k++) {
    if (exclude.includes(k)) continue;
    let numbers = 0;
    let text = 0;
    for (const r of t.rows) {
      const v = r[k];
      if (typeof v === 'number') numbers++;
      else if (typeof v === 'string') text++;
    }
    if (numbers > 0 && text === 0) out.push(k);
  }
  if (out.length === 0) throw new RemapError(`${t.name} has no column of numbers; pick columns with --columns.`);
  return out;
}

function readSide(
  io: CliIO,
  path: string,
  name: 'source' | 'target',
  flags: Record<string, string>,
  fn: string,
  scanned?: NumericTable | null,
): ReadSample & { header: string[] } {
  const wFlag = flags[`${name}-weights`];
  const input = scanned === undefined ? io.readInput?.(path) : undefined;
  const table = scanned !== undefined ? scanned : input ? scanNumericBytes(input.bytes, path, input.dialect) : scanNumericCSV(readText(io, path), path);
  const fast = table && sampleFromTable(table, { columns: flags.columns, weights: wFlag });
  if (fast) return fast;
  const t = readTable(path, readText(io, path));
  const wk = wFlag !== undefined ? columnIndex(t, wFlag, `--${name}-weights`) : -1;
  const cols = dataColumns(t, flags.columns, wk >= 0 ? [wk] : []);
  const cells = t.rows.map((r) => cols.map((k) => r[k]));
  const weights = wk >= 0 ? t.rows.map((r) => [r[wk]]) : null;
  if (cells.length === 0) throw new RemapError(`${path} has a header but no rows; add rows of numbers.`);
  const read = readSample(cells, { name, fn, weights, weightsName: `${name} weights (${wFlag})` });
  return { ...read, columns: cols.map((k) => t.header[k]), header: t.header };
}

function settingsFrom(flags: Record<string, string>): Record<string, unknown> {
  const out: Record<string, unknown> = flags.settings ? parseSettingsText(flags.settings) : Object.create(null);
  if (flags.seed !== undefined) out.seed = flags.seed;
  if (flags.tails !== undefined) out.tails = flags.tails;
  return out;
}

/**
 * The CSV file at path read by several threads when it is large (or --workers asks), as `scanNumericBytes` reads it;
 * undefined when it is read on this thread (readSide does it).
 */
async function readInParallel(io: CliIO, path: string, flags: Record<string, string>, threads: Threads): Promise<NumericTable | null | undefined> {
  const input = io.readInput?.(path);
  if (!input) return undefined;
  const workers = workerCount(flags.workers, input.bytes.length);
  if (workers < 2) return undefined;
  return scanInParallel(threads.pool(workers), input.bytes, path, input.dialect, flags.workers !== undefined);
}

async function fitFromFlags(
  io: CliIO,
  flags: Record<string, string>,
  command: string,
  threads: Threads,
): Promise<{ map: TransportMap; reason: string | null }> {
  const fn = `remap ${command}`;
  const sourcePath = need(flags, 'source', command);
  const targetPath = need(flags, 'target', command);
  const [sRead, tRead] = await Promise.all([readInParallel(io, sourcePath, flags, threads), readInParallel(io, targetPath, flags, threads)]);
  const s = readSide(io, sourcePath, 'source', flags, fn, sRead);
  const t = readSide(io, targetPath, 'target', flags, fn, tRead);
  if (s.columns!.join('\u0000') !== t.columns!.join('\u0000')) {
    throw new RemapError(
      `the source columns (${s.columns!.join(', ')}) and target columns (${t.columns!.join(', ')}) differ; give both files the same column names, or pick them with --columns.`,
    );
  }
  const settings = settingsFrom(flags);
  let method = (flags.method ?? '').trim().toLowerCase();
  let reason: string | null = null;
  if (method === '' || method === 'auto') {
    const c = chooseMethod(s.sample, t.sample, settings, method === 'auto');
    method = c.method;
    reason = c.reason;
  }
  // --seed is for the methods that draw random numbers; the exact and closed-form ones need none.
  if (flags.seed !== undefined && !settingSpecs(getMethod(method)).some((spec) => spec.name === 'seed')) delete settings.seed;
  let lastReport = Date.now(); // progress lines only for fits that take more than two seconds
  const map = await startFit(method, s.sample, t.sample, settings, {
    dropped: { source: s.dropped, target: t.dropped },
    columns: s.columns,
    onProgress: (p) => {
      const now = Date.now();
      if (now - lastReport > 2000) {
        lastReport = now;
        io.stderr(`remap: ${method} step ${p.step}/${p.of}, loss ${p.loss.toPrecision(4)}\n`);
      }
    },
  });
  return { map, reason };
}

function loadModel(io: CliIO, path: string): TransportMap {
  return loadModelText(io, path).map;
}

function loadModelText(io: CliIO, path: string): { map: TransportMap; text: string } {
  let text: string;
  try {
    text = io.readFile(path);
  } catch (e) {
    throw new RemapError(`cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
  }
  return { map: restoreMap(parseMapJSON(text)), text };
}

/** apply / invert through the general reader: every field a cell, errors worded per cell. */
function mapCells(map: TransportMap, t: Table, command: 'apply' | 'invert'): { csv: string; mapped: Mapped } {
  const inputPath = t.name;
  const names = map.diagnostics().columns;
  let cols: number[];
  if (names && names.every((c) => t.header.includes(c))) cols = names.map((c) => t.header.indexOf(c));
  else if (t.header.length === map.d) cols = t.header.map((_, k) => k);
  else {
    throw new RemapError(
      `${inputPath} has columns ${t.header.join(', ')}, but the map takes ${map.d} column${map.d === 1 ? '' : 's'}${names ? ` named ${names.join(', ')}` : ''}; give those columns.`,
    );
  }
  const cells = t.rows.map((r) => cols.map((k) => r[k]));
  for (let i = 0; i < cells.length; i++) {
    for (let j = 0; j < cols.length; j++) {
      const v = cells[i][j];
      if (typeof v === 'string')
        throw new RemapError(
          `${inputPath}, line ${i + 2}, column ${t.header[cols[j]]}: "${v}" is not a number; only numbers (or blanks) can be mapped: replace it or clear the field.`,
        );
      if (typeof v === 'number' && !Number.isFinite(v))
        throw new RemapError(
          `${inputPath}, line ${i + 2}, column ${t.header[cols[j]]}: ${v} is not a finite number; replace it with a number or clear the field.`,
        );
    }
  }
  const fn = `remap ${command}`;
  const { points, layout } = readValues(cells, map.d, fn);
  const mapped = command === 'apply' ? map.apply(points) : map.invert(points);
  const grid = writeValues(mapped, layout);
  const out: (string | number | null)[][] = [t.header];
  for (let i = 0; i < t.rows.length; i++) {
    const row = t.rows[i].map((v) => (v === null ? null : (v as string | number)));
    for (let j = 0; j < cols.length; j++) {
      const g = grid[i][j];
      // A per-cell error (a result that overflows) must not leave the unmapped input in its place.
      if (g instanceof CellError)
        throw new RemapError(`${inputPath}, line ${i + 2}, column ${t.header[cols[j]]}: ${g.message}`, g.kind === 'value' ? 'value' : 'num');
      row[cols[j]] = typeof g === 'number' ? g : g === '' ? null : row[cols[j]];
    }
    out.push(row);
  }
  return { csv: formatCSV(out), mapped };
}

/** Maps the columns of an input CSV the model knows, passing other columns through unchanged. */
async function mapFile(io: CliIO, flags: Record<string, string>, command: 'apply' | 'invert', threads: Threads): Promise<void> {
  const { map, text: model } = loadModelText(io, need(flags, 'model', command));
  const rows = await mapFileRows(io, flags, command, threads, map, model);
  // This call's own rows outside the fitted range, worded by what the method does there (not by the tails setting alone).
  const w = extrapolationWarning(map, rows, command);
  if (w) io.stderr(`remap: warning: ${oneLine(w.message)} ${w.action}\n`);
}

/** Maps the input file and writes the output; returns the rows mapped and how many lay outside the fitted range. */
async function mapFileRows(
  io: CliIO,
  flags: Record<string, string>,
  command: 'apply' | 'invert',
  threads: Threads,
  map: TransportMap,
  model: string,
): Promise<{ n: number; outside: number }> {
  const inputPath = need(flags, 'input', command);
  const input = io.readInput?.(inputPath);
  if (input) {
    // Large inputs: threads read, map and write pieces of the file; the output is the same bytes as on one thread.
    const workers = workerCount(flags.workers, input.bytes.length, estimateRows(input.bytes) * map.workPerRow(command));
    const done =
      workers > 1 ? await mapInParallel(threads.pool(workers), input.bytes, inputPath, input.dialect, model, command, flags.workers !== undefined) : null;
    if (done) {
      writeInPieces(io, flags.out, (sink) => done.pieces.forEach((p) => sink(p)));
      return done;
    }
  }
  const table = input ? scanNumericBytes(input.bytes, inputPath, input.dialect) : scanNumericCSV(readText(io, inputPath), inputPath);
  const fast = table && mapTable(table, map, command);
  if (fast) {
    writeInPieces(io, flags.out, fast.write);
    return fast.mapped;
  }
  const general = mapCells(map, readTable(inputPath, readText(io, inputPath)), command);
  if (flags.out) io.writeFile(flags.out, general.csv);
  else io.stdout(general.csv);
  return general.mapped;
}

/** Writes output made in pieces to --out (or stdout): piece by piece where the IO can, else joined once. */
function writeInPieces(io: CliIO, out: string | undefined, write: (sink: (chunk: Uint8Array) => void) => void): void {
  if (io.openOut) {
    let file;
    try {
      file = io.openOut(out ?? null);
    } catch (e) {
      throw new RemapError(`cannot write ${out} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
    }
    try {
      write(file.write);
    } finally {
      file.close();
    }
    return;
  }
  const pieces: Uint8Array[] = [];
  write((chunk) => pieces.push(chunk));
  const text = Buffer.concat(pieces).toString('utf8');
  if (out) io.writeFile(out, text);
  else io.stdout(text);
}

/** A message on one line: names read from files (quoted CSV headers) may hold line breaks. */
function oneLine(message: string): string {
  return message.replace(/\s*[\r\n]+\s*/g, ' ');
}

/** Runs one command; returns the process exit code. */
/** The command's worker threads, started when a large input first needs them and ended when the command ends. */
class Threads {
  private started: WorkerPool | null = null;
  pool(size: number): WorkerPool {
    if (!this.started || this.started.size !== size) {
      void this.started?.close();
      this.started = new WorkerPool(size);
    }
    return this.started;
  }
  async close(): Promise<void> {
    await this.started?.close();
    this.started = null;
  }
}

export async function main(argv: readonly string[], cliIO: CliIO): Promise<number> {
  const threads = new Threads();
  try {
    return await run(argv, cliIO, threads);
  } finally {
    await threads.close();
  }
}

async function run(argv: readonly string[], cliIO: CliIO, threads: Threads): Promise<number> {
  let command = '';
  let io = cliIO;
  try {
    const parsed = parseArgs(argv);
    command = parsed.command;
    const flags = parsed.flags;
    if (flags.workers !== undefined) workerCount(flags.workers, 0); // a bad count is reported before any work
    const routed = await route(command, flags, io);
    if ('code' in routed) return routed.code;
    io = routed.io;
    switch (command) {
      case 'fit': {
        const out = need(flags, 'out', 'fit');
        const { map, reason } = await fitFromFlags(io, flags, 'fit', threads);
        io.writeFile(out, JSON.stringify(map.toJSON()));
        const diag = map.diagnostics();
        io.stderr(
          `remap: fitted ${diag.method} on ${diag.n.source} x ${diag.n.target} rows, ${diag.d} column${diag.d === 1 ? '' : 's'}; cost (${diag.cost.label}) ${diag.cost.w2Squared.toPrecision(6)}; wrote ${out}.\n`,
        );
        if (reason) io.stderr(`remap: method chosen: ${reason}\n`);
        for (const w of diag.warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
        io.stderr(`remap: ${diag.reminder}\n`);
        map.dispose();
        return 0;
      }
      case 'apply':
      case 'invert':
        await mapFile(io, flags, command, threads);
        return 0;
      case 'cost': {
        const { map, reason } = await fitFromFlags(io, flags, 'cost', threads);
        const c = map.cost();
        const diag = map.diagnostics();
        const result: Record<string, unknown> = {
          method: diag.method,
          w2_squared: c.w2Squared,
          w2: c.w2,
          ...(c.w1 !== undefined ? { w1: c.w1 } : {}),
          ...(c.perColumn ? { per_column_w2_squared: c.perColumn } : {}),
          // What the figure is: w2_squared is the squared W2 itself only when bound is "exact".
          bound: c.bound,
          label: c.label,
          ...(c.units ? { units: c.units } : {}),
          kind: c.kind,
          note: c.note,
          n_source: diag.n.source,
          n_target: diag.n.target,
          d: diag.d,
          ...(reason ? { method_reason: reason } : {}),
          ...(diag.effectiveSize ? { effective_size: diag.effectiveSize } : {}),
          warnings: diag.warnings.map((w) => w.message),
          reminder: diag.reminder,
        };
        io.stdout(JSON.stringify(result, null, 2) + '\n');
        map.dispose();
        return 0;
      }
      case 'report': {
        const map = loadModel(io, need(flags, 'model', 'report'));
        io.stdout(JSON.stringify(map.diagnostics(), null, 2) + '\n');
        return 0;
      }
      case 'methods': {
        for (const m of listMethods()) io.stdout(`${m.name.padEnd(13)} ${m.summary}\n`);
        return 0;
      }
    }
    if (command in MORE_COMMANDS) return await runMoreCommand(command, flags, io);
    throw new UsageError(`unknown command "${command}"`);
  } catch (e) {
    if (e instanceof UsageError || e instanceof CommandUsageError) {
      if (e.message) {
        io.stderr(`remap: ${oneLine(e.message)}\n`);
        return 2;
      }
      io.stdout(usage() + '\n');
      return argv.length === 0 ? 2 : 0;
    }
    if (isRemapError(e)) {
      io.stderr(`remap: ${oneLine(e.message)}\n`);
      return 1;
    }
    io.stderr(`remap: unexpected problem${command ? ` in ${command}` : ''}: ${oneLine(String((e as Error)?.message ?? e))}\n`);
    return 1;
  }
}

import { RemapError } from '../engine/errors';
import { fitGroupedMap } from '../engine/groups/fit-grouped';
import { parseGroupedMapJSON, restoreGroupedMap } from '../engine/groups/grouped-json';
import type { Points, Sample } from '../engine/points';
import { parseSettingsText } from '../engine/settings';
import { fitFromTables, type Distribution1d, type TableBeyond } from '../engine/tables/fit-from-tables';
import { frequencyTable } from '../engine/tables/frequency-table';
import { quantileTable } from '../engine/tables/quantile-table';
import { bootstrapBounds } from '../engine/uncertainty/bootstrap-bounds';
import { replicateBounds, type ReplicateWeights } from '../engine/uncertainty/replicate-bounds';
import type { ReplicateKind } from '../engine/uncertainty/replicate-variance';
import { csvCell, formatCSV, parseCSV } from './csv';

/**
 * The commands for maps by group, maps from distribution tables and bounds on
 * mapped values. Each reads CSV with a header row; a row with a blank or text
 * field in a column it uses is dropped (and counted on stderr), a non-finite
 * number is an error.
 */

export interface MoreIO {
  readonly stdout: (s: string) => void;
  readonly stderr: (s: string) => void;
  readonly readFile: (path: string) => string;
  readonly writeFile: (path: string, text: string) => void;
}

/** Bad usage (exit code 2), as opposed to bad data (exit code 1). */
export class CommandUsageError extends Error {}

const SAMPLE_FLAGS = ['source', 'target', 'method', 'columns', 'source-weights', 'target-weights', 'settings', 'seed', 'tails'];

export const MORE_COMMANDS: Record<string, { flags: string[]; summary: string }> = {
  'fit-groups': {
    flags: [...SAMPLE_FLAGS, 'source-group-column', 'target-group-column', 'fallback', 'out'],
    summary:
      'remap fit-groups --source S.csv --target T.csv --source-group-column G --target-group-column G [--fallback none|pooled] [fit options] --out groups.json',
  },
  'apply-groups': {
    flags: ['model', 'input', 'group-column', 'out'],
    summary: 'remap apply-groups --model groups.json --input X.csv --group-column G [--out Y.csv]',
  },
  'invert-groups': {
    flags: ['model', 'input', 'group-column', 'out'],
    summary: 'remap invert-groups --model groups.json --input Y.csv --group-column G [--out X.csv]',
  },
  'report-groups': { flags: ['model'], summary: 'remap report-groups --model groups.json' },
  'fit-table': {
    flags: ['source', 'target', 'source-table', 'target-table', 'method', 'columns', 'source-weights', 'target-weights', 'beyond', 'settings', 'tails', 'out'],
    summary:
      'remap fit-table (--source S.csv | --source-table s.csv) (--target T.csv | --target-table t.csv) [--beyond hold|extend] [--method M] --out model.json',
  },
  bounds: {
    flags: [...SAMPLE_FLAGS, 'input', 'level', 'replicates', 'source-replicates', 'target-replicates', 'replicate-kind', 'fay', 'multiplier', 'shared', 'out'],
    summary:
      'remap bounds --source S.csv --target T.csv --input X.csv [--method quantile|step|ordinal|linear] [--level 0.95] [--replicates 1000] [--seed N] [--source-replicates rw1,rw2|rw*] [--target-replicates ...] [--replicate-kind bootstrap|jackknife|brr|custom] [--fay K] [--multiplier C] [--shared yes] [--out B.csv]',
  },
};

interface Table {
  readonly name: string;
  readonly header: string[];
  readonly rows: (number | string | null)[][];
}

function readTable(io: MoreIO, path: string): Table {
  let text: string;
  try {
    text = io.readFile(path);
  } catch (e) {
    throw new RemapError(`cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
  }
  const rows = parseCSV(text, path);
  if (rows.length < 2) throw new RemapError(`${path} needs a header row and at least one row of data.`);
  return { name: path, header: rows[0].map((h) => h.trim()), rows: rows.slice(1).map((r) => r.map(csvCell)) };
}

function col(t: Table, name: string, what: string): number {
  const k = t.header.indexOf(name.trim());
  if (k < 0) throw new RemapError(`${t.name} has no column "${name}" (${what}); its columns are ${t.header.join(', ')}.`);
  return k;
}

function need(flags: Record<string, string>, name: string, command: string): string {
  const v = flags[name];
  if (v === undefined || v === '') throw new CommandUsageError(`${command} needs --${name}; usage: ${MORE_COMMANDS[command].summary}`);
  return v;
}

/** Data columns: --columns, else every column of numbers not otherwise used. */
function dataColumns(t: Table, columns: string | undefined, exclude: number[]): number[] {
  if (columns !== undefined)
    return columns
      .split(',')
      .map((c) => c.trim())
      .filter((c) => c !== '')
      .map((c) => col(t, c, '--columns'));
  const out: number[] = [];
  for (let k = 0; k < t.header.length; k++) {
    if (exclude.includes(k)) continue;
    if (t.rows.some((r) => typeof r[k] === 'number') && !t.rows.some((r) => typeof r[k] === 'string')) out.push(k);
  }
  if (out.length === 0) throw new RemapError(`${t.name} has no column of numbers; pick columns with --columns.`);
  return out;
}

/** Rows whose used fields are all numbers (and groups non-blank); others are dropped and counted. */
interface Read {
  readonly sample: Sample;
  readonly columns: string[];
  readonly groups: (string | number)[];
  readonly kept: number[];
  readonly dropped: number;
  readonly table: Table;
}

function readRows(
  io: MoreIO,
  path: string,
  flags: Record<string, string>,
  side: 'source' | 'target' | 'input',
  groupFlag: string | null,
  extra: number[] = [],
): Read {
  const t = readTable(io, path);
  const wName = side === 'input' ? undefined : flags[`${side}-weights`];
  const wk = wName !== undefined ? col(t, wName, `--${side}-weights`) : -1;
  const gk = groupFlag ? col(t, flags[groupFlag], `--${groupFlag}`) : -1;
  const cols = dataColumns(
    t,
    flags.columns,
    [wk, gk, ...extra].filter((k) => k >= 0),
  );
  const d = cols.length;
  const data: number[] = [];
  const weights: number[] = [];
  const groups: (string | number)[] = [];
  const kept: number[] = [];
  let dropped = 0;
  t.rows.forEach((r, i) => {
    const used = [...cols, ...(wk >= 0 ? [wk] : []), ...extra];
    for (const k of used) {
      const v = r[k];
      if (typeof v === 'number' && !Number.isFinite(v))
        throw new RemapError(`${path}, line ${i + 2}, column ${t.header[k]}: ${v} is not a finite number; replace it or clear the field.`);
    }
    if (used.some((k) => typeof r[k] !== 'number') || (gk >= 0 && (r[gk] === null || String(r[gk]).trim() === ''))) {
      dropped++;
      return;
    }
    for (const k of cols) data.push(r[k] as number);
    if (wk >= 0) weights.push(r[wk] as number);
    if (gk >= 0) groups.push(r[gk] as string | number);
    kept.push(i);
  });
  if (kept.length === 0) throw new RemapError(`${path} has no row with numbers in every column used; check the columns.`);
  const sample: Sample = { n: kept.length, d, data: Float64Array.from(data), weights: wk >= 0 ? Float64Array.from(weights) : null };
  return { sample, columns: cols.map((k) => t.header[k]), groups, kept, dropped, table: t };
}

function settingsFrom(flags: Record<string, string>, withSeed: boolean): Record<string, unknown> {
  const out: Record<string, unknown> = flags.settings ? parseSettingsText(flags.settings) : Object.create(null);
  if (withSeed && flags.seed !== undefined) out.seed = flags.seed;
  if (flags.tails !== undefined) out.tails = flags.tails;
  return out;
}

function note(io: MoreIO, r: Read, what: string): void {
  if (r.dropped > 0) io.stderr(`remap: ${r.dropped} ${what} row${r.dropped === 1 ? '' : 's'} with a blank or text field were skipped.\n`);
}

/** A distribution table from CSV: columns probability and value (quantiles), or value and count or share (frequencies). */
function readDistributionTable(io: MoreIO, path: string): Distribution1d {
  const t = readTable(io, path);
  const lower = t.header.map((h) => h.toLowerCase());
  const v = lower.indexOf('value');
  const p = lower.indexOf('probability');
  const a = lower.indexOf('count') >= 0 ? lower.indexOf('count') : lower.indexOf('share');
  if (v < 0 || (p < 0 && a < 0)) {
    throw new RemapError(
      `${path}: a distribution table needs the columns probability and value (a quantile table), or value and count (or share) (a frequency table); its columns are ${t.header.join(', ')}.`,
    );
  }
  const nums = (k: number) =>
    t.rows.map((r, i) => {
      const x = r[k];
      if (typeof x !== 'number')
        throw new RemapError(`${path}, line ${i + 2}, column ${t.header[k]}: "${String(x ?? '')}" is not a number; every row of a table needs numbers.`);
      return x;
    });
  if (p >= 0) return { kind: 'quantiles', table: quantileTable(nums(p), nums(v), path) };
  return { kind: 'frequencies', table: frequencyTable(nums(v), nums(a), path) };
}

function replicateColumns(t: Table, spec: string): number[] {
  const names = spec
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
  const out: number[] = [];
  for (const n of names) {
    if (n.endsWith('*')) {
      const prefix = n.slice(0, -1);
      const ks = t.header.map((h, k) => (h.startsWith(prefix) ? k : -1)).filter((k) => k >= 0);
      if (ks.length === 0) throw new RemapError(`${t.name} has no column starting with "${prefix}"; its columns are ${t.header.join(', ')}.`);
      out.push(...ks);
    } else out.push(col(t, n, 'replicate weights'));
  }
  return out;
}

function replicatesOf(r: Read, ks: number[], flags: Record<string, string>): ReplicateWeights {
  const R = ks.length;
  const data = new Float64Array(r.kept.length * R);
  r.kept.forEach((row, i) => ks.forEach((k, j) => (data[i * R + j] = r.table.rows[row][k] as number)));
  const kind = (flags['replicate-kind'] ?? 'bootstrap').trim().toLowerCase() as ReplicateKind;
  return {
    kind,
    weights: { n: r.kept.length, d: R, data },
    fay: flags.fay !== undefined ? Number(flags.fay) : undefined,
    multiplier: flags.multiplier !== undefined ? Number(flags.multiplier) : undefined,
  };
}

/** Runs one of MORE_COMMANDS; returns the exit code (errors are thrown for main to print). */
export async function runMoreCommand(command: string, flags: Record<string, string>, io: MoreIO): Promise<number> {
  switch (command) {
    case 'fit-groups': {
      const out = need(flags, 'out', command);
      need(flags, 'source-group-column', command);
      need(flags, 'target-group-column', command);
      const s = readRows(io, need(flags, 'source', command), flags, 'source', 'source-group-column');
      const t = readRows(io, need(flags, 'target', command), flags, 'target', 'target-group-column');
      note(io, s, 'source');
      note(io, t, 'target');
      const fallback = (flags.fallback ?? 'none').trim().toLowerCase();
      if (fallback !== 'none' && fallback !== 'pooled') throw new CommandUsageError(`--fallback is "${flags.fallback}"; choose none or pooled.`);
      const map = await fitGroupedMap(flags.method ?? 'quantile', s.sample, s.groups, t.sample, t.groups, settingsFrom(flags, true), {
        fallback: fallback as 'none' | 'pooled',
        ctx: { columns: s.columns, dropped: { source: s.dropped, target: t.dropped } },
      });
      io.writeFile(out, JSON.stringify(map.toJSON()));
      const rep = map.report();
      io.stderr(`remap: fitted ${rep.method} in ${rep.groups.length} groups; mean squared W2 ${rep.cost.w2Squared.toPrecision(6)}; wrote ${out}.\n`);
      for (const w of rep.warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
      map.dispose();
      return 0;
    }
    case 'apply-groups':
    case 'invert-groups': {
      const map = restoreGroupedMap(parseGroupedMapJSON(readText(io, need(flags, 'model', command))));
      const f: Record<string, string> = { 'group-column': need(flags, 'group-column', command) };
      if (map.columns) f.columns = map.columns.join(',');
      const input = readRows(io, need(flags, 'input', command), f, 'input', 'group-column');
      note(io, input, 'input');
      const mapped = command === 'apply-groups' ? map.apply(input.sample, input.groups) : map.invert(input.sample, input.groups);
      writeMapped(io, flags, input, mapped);
      for (const w of map.report().warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
      return 0;
    }
    case 'report-groups': {
      const map = restoreGroupedMap(parseGroupedMapJSON(readText(io, need(flags, 'model', command))));
      io.stdout(JSON.stringify(map.report(), null, 2) + '\n');
      return 0;
    }
    case 'fit-table': {
      const out = need(flags, 'out', command);
      const side = (which: 'source' | 'target'): Distribution1d => {
        if (flags[`${which}-table`] && flags[which]) throw new CommandUsageError(`give either --${which} or --${which}-table, not both.`);
        if (flags[`${which}-table`]) return readDistributionTable(io, flags[`${which}-table`]);
        const r = readRows(io, need(flags, which, command), flags, which, null);
        note(io, r, which);
        if (r.sample.d !== 1) throw new RemapError(`${flags[which]}: fit-table maps one column; pick it with --columns.`);
        return { kind: 'sample', sample: r.sample };
      };
      const beyond = (flags.beyond ?? 'hold').trim().toLowerCase();
      if (beyond !== 'hold' && beyond !== 'extend') throw new CommandUsageError(`--beyond is "${flags.beyond}"; choose hold or extend.`);
      const map = fitFromTables(flags.method ?? 'quantile', side('source'), side('target'), settingsFrom(flags, false), beyond as TableBeyond);
      io.writeFile(out, JSON.stringify(map.toJSON()));
      const diag = map.diagnostics();
      io.stderr(`remap: fitted ${diag.method} from tables; squared W2 ${diag.cost.w2Squared.toPrecision(6)}; wrote ${out}.\nremap: ${diag.cost.note}\n`);
      for (const w of diag.warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
      return 0;
    }
    case 'bounds': {
      const method = flags.method ?? 'quantile';
      const sFile = need(flags, 'source', command);
      const tFile = need(flags, 'target', command);
      const sT = readTable(io, sFile);
      const tT = readTable(io, tFile);
      const sRep = flags['source-replicates'] ? replicateColumns(sT, flags['source-replicates']) : [];
      const tRep = flags['target-replicates'] ? replicateColumns(tT, flags['target-replicates']) : [];
      const s = readRows(io, sFile, flags, 'source', null, sRep);
      const t = readRows(io, tFile, flags, 'target', null, tRep);
      const input = readRows(io, need(flags, 'input', command), { columns: s.columns.join(',') }, 'input', null);
      note(io, s, 'source');
      note(io, t, 'target');
      note(io, input, 'input');
      const level = flags.level !== undefined ? Number(flags.level) : 0.95;
      const settings = settingsFrom(flags, false);
      const b =
        sRep.length > 0 || tRep.length > 0
          ? replicateBounds(method, s.sample, t.sample, input.sample, {
              source: sRep.length > 0 ? replicatesOf(s, sRep, flags) : undefined,
              target: tRep.length > 0 ? replicatesOf(t, tRep, flags) : undefined,
              shared: /^(yes|true|1)$/i.test(flags.shared ?? ''),
              level,
              settings,
            })
          : bootstrapBounds(method, s.sample, t.sample, input.sample, {
              level,
              replicates: flags.replicates !== undefined ? Number(flags.replicates) : undefined,
              seed: flags.seed !== undefined ? Number(flags.seed) : undefined,
              settings,
            });
      const header = input.columns.flatMap((c) => [c, `${c}_mapped`, `${c}_lower`, `${c}_upper`]);
      const rows: (number | string)[][] = [header];
      for (let i = 0; i < b.n; i++) {
        const row: number[] = [];
        for (let k = 0; k < b.d; k++) {
          const j = i * b.d + k;
          row.push(input.sample.data[j], b.estimate[j], b.lower[j], b.upper[j]);
        }
        rows.push(row);
      }
      const csv = formatCSV(rows);
      if (flags.out) io.writeFile(flags.out, csv);
      else io.stdout(csv);
      io.stderr(`remap: ${b.note}\n`);
      for (const w of b.warnings) io.stderr(`remap: warning: ${w.message} ${w.action}\n`);
      return 0;
    }
  }
  throw new CommandUsageError(`unknown command "${command}"`);
}

function readText(io: MoreIO, path: string): string {
  try {
    return io.readFile(path);
  } catch (e) {
    throw new RemapError(`cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); check the path.`);
  }
}

/** The input CSV again, with the mapped columns replaced (rows that were skipped keep their fields). */
function writeMapped(io: MoreIO, flags: Record<string, string>, input: Read, mapped: Points): void {
  const t = input.table;
  const cols = input.columns.map((c) => t.header.indexOf(c));
  const out: (string | number | null)[][] = [t.header];
  const at = new Map(input.kept.map((row, i) => [row, i]));
  t.rows.forEach((r, row) => {
    const copy = r.slice();
    const i = at.get(row);
    if (i !== undefined) cols.forEach((k, j) => (copy[k] = mapped.data[i * mapped.d + j]));
    out.push(copy);
  });
  const csv = formatCSV(out);
  if (flags.out) io.writeFile(flags.out, csv);
  else io.stdout(csv);
}

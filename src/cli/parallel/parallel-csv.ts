import * as os from 'os';
import { RemapError } from '../../engine/errors';
import { TEXT, type ByteRange, type NumericTable, type ScanDialect } from '../numeric-csv';
import { lineChunks, type LineChunks } from './line-chunks';
import type { MappedPiece } from './messages';
import type { WorkerPool } from './pool';

/** Inputs from this size up are read by several threads when --workers is not given. */
export const AUTO_MIN_BYTES = 32 << 20;
/**
 * Maps whose work on an input (rows x the map's work per row, in multiply-adds) is at least this are applied by several
 * threads whatever the input's size: about half a second on one core.
 */
export const AUTO_MIN_WORK = 5e8;
/** The most threads --workers accepts, and the most the automatic choice uses. */
export const MAX_WORKERS = 64;
const AUTO_MAX_WORKERS = 8;

/**
 * How many threads read (and map) an input of `bytes` bytes: --workers as given (1 = this thread only), else one
 * per processor (at most 8) for inputs of 32 MB or more, or whose mapping costs `work` >= AUTO_MIN_WORK multiply-adds
 * (below both, starting the threads costs about what they save: measured in bench/cli.bench.ts), and 1 otherwise.
 * Results are the same bytes whatever the count.
 * @throws RemapError when --workers is not a whole number from 1 to 64.
 * @example workerCount('3', 10) // 3
 */
export function workerCount(flag: string | undefined, bytes: number, work = 0): number {
  if (flag !== undefined) {
    const n = Number(flag.trim());
    if (!Number.isInteger(n) || n < 1 || n > MAX_WORKERS) {
      throw new RemapError(`--workers is "${flag}"; give a whole number from 1 to ${MAX_WORKERS} (1 reads on one thread), or leave it out.`);
    }
    return n;
  }
  if (bytes < AUTO_MIN_BYTES && work < AUTO_MIN_WORK) return 1;
  const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
  return Math.max(1, Math.min(cores, AUTO_MAX_WORKERS));
}

/** Files read and files mapped by threads in this process (a file that fell back to one thread is not counted). */
export const threadUse = { read: 0, mapped: 0 };

/**
 * About how many data lines a CSV file holds, from the length of the lines in its first 64 KB. O(64 KB).
 * @example estimateRows(Buffer.from('x\n1\n2\n')) // 2
 */
export function estimateRows(bytes: Uint8Array): number {
  const head = Math.min(bytes.length, 1 << 16);
  let lines = 0;
  for (let i = 0; i < head; i++) if (bytes[i] === 10) lines++;
  if (lines === 0) return 1;
  return Math.max(1, Math.round((bytes.length * lines) / head) - 1);
}

/** The smallest piece worth a thread: small when the user asked for threads, about a megabyte otherwise. */
function minPiece(explicit: boolean): number {
  return explicit ? 1024 : 1 << 20;
}

/**
 * The file's bytes in shared memory, so every worker reads its piece where it lies: as given when they are already
 * there (bin/remap.js reads files into shared memory), else one copy. O(length) at most.
 */
function shared(bytes: Uint8Array): Uint8Array {
  if (typeof SharedArrayBuffer !== 'undefined' && bytes.buffer instanceof SharedArrayBuffer) return bytes;
  const out = new Uint8Array(new SharedArrayBuffer(bytes.length));
  out.set(bytes);
  return out;
}

/** The rows of piece i. */
function rowsOf(chunks: LineChunks, i: number): ByteRange {
  return { from: chunks.cuts[i], to: chunks.cuts[i + 1] };
}

/**
 * Reads a CSV file's bytes as `scanNumericBytes` does, with the pieces read by the pool's threads at once.
 * @returns the table (identical to reading it on one thread), null when the general reader must read it, or undefined
 * when the file is not cut (too small, or it has quotes): the caller then reads it on its own thread.
 */
export async function scanInParallel(
  pool: WorkerPool,
  bytes: Uint8Array,
  name: string,
  dialect: ScanDialect,
  explicit: boolean,
): Promise<NumericTable | null | undefined> {
  const chunks = lineChunks(bytes, pool.size, minPiece(explicit));
  if (!chunks) return undefined;
  const all = shared(bytes);
  const replies = await Promise.all(chunks.cuts.slice(0, -1).map((_, i) => pool.run({ kind: 'scan', bytes: all, rows: rowsOf(chunks, i), name, dialect })));
  const tables: NumericTable[] = [];
  for (const r of replies) {
    if (r.kind !== 'scan' || r.table === null) return null;
    tables.push(r.table);
  }
  const merged = mergeTables(name, tables);
  if (merged) threadUse.read++;
  return merged;
}

/**
 * The tables of consecutive pieces of one file as one table, or null when a piece before the last ended in empty
 * lines (dropped at a piece's end, but rows of blanks inside the file: the general reader decides). O(cells).
 */
export function mergeTables(name: string, parts: readonly NumericTable[]): NumericTable | null {
  for (let i = 0; i + 1 < parts.length; i++) if (parts[i].lines !== parts[i].rows) return null;
  const width = parts[0].header.length;
  const rows = parts.reduce((s, t) => s + t.rows, 0);
  const values = Array.from({ length: width }, () => new Float64Array(rows));
  const kinds = Array.from({ length: width }, () => new Uint8Array(rows));
  const texts: string[] = [];
  let at = 0;
  for (const t of parts) {
    for (let k = 0; k < width; k++) {
      values[k].set(t.values[k].subarray(0, t.rows), at);
      kinds[k].set(t.kinds[k].subarray(0, t.rows), at);
      if (texts.length > 0) {
        // Text fields point into their piece's list: move them past the texts of the pieces before.
        const v = values[k];
        const kk = kinds[k];
        for (let i = at; i < at + t.rows; i++) if (kk[i] === TEXT) v[i] += texts.length;
      }
    }
    for (const s of t.texts) texts.push(s);
    at += t.rows;
  }
  const last = parts[parts.length - 1];
  return { name, header: parts[0].header, rows, lines: rows - last.rows + (last.lines ?? last.rows), values, kinds, texts };
}

/**
 * `remap apply` / `invert` of a CSV file's bytes with the pool's threads: each reads its piece, maps it with the
 * saved map and writes its lines; the pieces' output, in order, is the bytes one thread writes.
 * @returns the output pieces with the rows mapped and outside the fitted range, or null when the file is not cut or
 * some piece needs the general path (text or blanks to map, an error to word): the caller then maps the whole file
 * on its own thread.
 */
export async function mapInParallel(
  pool: WorkerPool,
  bytes: Uint8Array,
  name: string,
  dialect: ScanDialect,
  model: string,
  direction: 'apply' | 'invert',
  explicit: boolean,
): Promise<MappedPiece | null> {
  const chunks = lineChunks(bytes, pool.size, minPiece(explicit));
  if (!chunks) return null;
  const all = shared(bytes);
  const replies = await Promise.all(
    chunks.cuts
      .slice(0, -1)
      .map((_, i, pieces) =>
        pool.run({ kind: 'map', bytes: all, rows: rowsOf(chunks, i), name, dialect, model, direction, header: i === 0, last: i === pieces.length - 1 }),
      ),
  );
  const pieces: Uint8Array[] = [];
  let n = 0;
  let outside = 0;
  for (const r of replies) {
    if (r.kind !== 'map' || r.result === null) return null;
    pieces.push(...r.result.pieces);
    n += r.result.n;
    outside += r.result.outside;
  }
  threadUse.mapped++;
  return { pieces, n, outside };
}

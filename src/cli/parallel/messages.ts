import type { ByteRange, NumericTable, ScanDialect } from '../numeric-csv';

/**
 * Work for a CLI worker: read a piece of a CSV file (the rows in `rows`; the header from the start of `bytes`), or read
 * it, map it and write it. `bytes` is the whole file in shared memory (never copied to the worker).
 */
export type WorkerTask =
  | { readonly kind: 'scan'; readonly bytes: Uint8Array; readonly rows: ByteRange; readonly name: string; readonly dialect: ScanDialect }
  | {
      readonly kind: 'map';
      readonly bytes: Uint8Array;
      readonly rows: ByteRange;
      readonly name: string;
      readonly dialect: ScanDialect;
      /** The map's JSON, as saved (each worker restores it once). */
      readonly model: string;
      readonly direction: 'apply' | 'invert';
      /** Whether the output starts with the header line (the first piece only). */
      readonly header: boolean;
      /** Whether this is the file's last piece (only there may empty lines end it). */
      readonly last: boolean;
    };

/** A piece mapped: its output bytes in order, rows mapped, and rows outside the fitted range. */
export interface MappedPiece {
  readonly pieces: Uint8Array[];
  readonly n: number;
  readonly outside: number;
}

/**
 * A worker's answer. null: the piece needs the general reader (the caller then reads the whole file on one thread,
 * which also words any error); 'error': something threw (the caller does the same).
 */
export type WorkerReply =
  | { readonly kind: 'scan'; readonly table: NumericTable | null }
  | { readonly kind: 'map'; readonly result: MappedPiece | null }
  | { readonly kind: 'error'; readonly message: string };

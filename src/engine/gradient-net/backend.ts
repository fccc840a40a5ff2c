import * as tf from '@tensorflow/tfjs';
import { setWasmPaths } from '@tensorflow/tfjs-backend-wasm';
import { RemapError } from '../errors';

/** Tensor backends the gradient-net method trains on. */
export type BackendName = 'wasm' | 'cpu';

export interface BackendOptions {
  /**
   * Folder (URL or file path, ending in '/') holding tfjs-backend-wasm's .wasm
   * files. In the add-in: 'wasm/' (served next to the page). In Node leave it out:
   * the package then finds its files in node_modules by itself (measured), or give
   * the path of node_modules/@tensorflow/tfjs-backend-wasm/dist/. Nothing is ever
   * downloaded from elsewhere.
   */
  readonly wasmPath?: string;
  /** 'wasm' (default): each fit uses its `backend` setting; 'cpu': every fit uses the cpu backend. */
  readonly prefer?: BackendName;
}

let options: { wasmPath: string | undefined; prefer: BackendName } = { wasmPath: undefined, prefer: 'wasm' };
let wasmFailed: string | null = null;
let queue: Promise<unknown> = Promise.resolve();

/**
 * Sets where the wasm backend's binaries live and which backend fits prefer.
 * Call once at start-up, before the first fit (the wasm binaries load once per
 * page or process; a later path change applies only if wasm has not loaded yet).
 * O(1).
 * @throws RemapError for an empty path or an unknown backend name.
 * @example configureBackend({ wasmPath: 'wasm/' }) // the add-in's setting
 */
export function configureBackend(opts: BackendOptions = {}): void {
  if (opts.wasmPath !== undefined && (typeof opts.wasmPath !== 'string' || opts.wasmPath.trim() === '')) {
    throw new RemapError(`configureBackend: wasmPath must be a folder path or URL such as "wasm/", not "${String(opts.wasmPath)}".`);
  }
  if (opts.prefer !== undefined && opts.prefer !== 'wasm' && opts.prefer !== 'cpu') {
    throw new RemapError(`configureBackend: prefer must be "wasm" or "cpu", not "${String(opts.prefer)}".`);
  }
  options = { wasmPath: opts.wasmPath ?? options.wasmPath, prefer: opts.prefer ?? options.prefer };
  if (opts.wasmPath !== undefined) {
    setWasmPaths(opts.wasmPath);
    wasmFailed = null;
  }
}

/**
 * Switches tfjs to the requested backend, falling back to 'cpu' when the wasm
 * binaries cannot be loaded (the reason is returned so the fit can say so).
 * tfjs has one global backend, so fits are run one at a time through `exclusive`.
 * @returns the backend in use and, on fallback, why wasm was not used.
 */
export async function activateBackend(wanted: BackendName): Promise<{ backend: BackendName; fallback: string | null }> {
  const name: BackendName = options.prefer === 'cpu' ? 'cpu' : wanted;
  if (name === 'wasm' && wasmFailed === null) {
    let ok = false;
    try {
      ok = await tf.setBackend('wasm');
      await tf.ready();
    } catch (e) {
      wasmFailed = e instanceof Error ? e.message : String(e);
    }
    if (ok) return { backend: 'wasm', fallback: null };
    wasmFailed = wasmFailed ?? 'the wasm backend did not initialise';
  }
  const ok = await tf.setBackend('cpu');
  await tf.ready();
  if (!ok) throw new RemapError('gradient-net: neither the wasm nor the cpu tensor backend could start; reload the add-in.', 'num');
  return { backend: 'cpu', fallback: name === 'wasm' ? wasmFailed : null };
}

/**
 * Runs `job` after every job started before it has finished, so that two fits
 * never share the one global tfjs backend at the same time (which would also
 * break bit-for-bit reproducibility).
 * @example await exclusive(() => train(...))
 */
export function exclusive<T>(job: () => Promise<T>): Promise<T> {
  const run = queue.then(job, job);
  queue = run.then(
    () => undefined,
    () => undefined,
  );
  return run;
}

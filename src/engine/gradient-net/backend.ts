import { RemapError } from '../errors';

/**
 * Where the tensor backend comes from, without loading TensorFlow.js: this file
 * holds the options and the one-fit-at-a-time queue, so the rest of the engine
 * (and the worksheet bundle) can import it cheaply. The backend itself is
 * switched on in activate-backend.ts, which the trainer loads only when a
 * gradient-net fit starts.
 */

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

/** The options in force; `pathChanged` tells the activation to pass a new path to the wasm backend. */
export const backendOptions: { wasmPath: string | undefined; prefer: BackendName; pathChanged: boolean } = {
  wasmPath: undefined,
  prefer: 'wasm',
  pathChanged: false,
};
let queue: Promise<unknown> = Promise.resolve();

/**
 * Sets where the wasm backend's binaries live and which backend fits prefer.
 * Call once at start-up, before the first fit (the wasm binaries load once per
 * page or process; a later path change applies only if wasm has not loaded yet).
 * Loads nothing. O(1).
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
  backendOptions.prefer = opts.prefer ?? backendOptions.prefer;
  if (opts.wasmPath !== undefined) {
    backendOptions.wasmPath = opts.wasmPath;
    backendOptions.pathChanged = true;
  }
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

import * as tf from '@tensorflow/tfjs-core';
import '@tensorflow/tfjs-backend-cpu';
import { setWasmPaths } from '@tensorflow/tfjs-backend-wasm';
import { RemapError } from '../errors';
import { backendOptions, type BackendName } from './backend';

/**
 * The only place TensorFlow.js is loaded for training: the core (with its
 * gradient definitions) and the two backends the product offers, cpu and wasm,
 * all from the same 4.x family, and the gradient definitions (registerGradients).
 * Loaded on demand with the trainer (train.ts), which method.ts imports only
 * when a fit with at least one step starts.
 */
let wasmFailed: string | null = null;
let gradients: Promise<unknown> | null = null;

/**
 * Registers tfjs-core's gradient definitions once. Bundles for the add-in take
 * them from tfjs-core's own module (an ES module). Node cannot load that file
 * from a CommonJS package, and there the umbrella package's Node build is the
 * one that carries them (it registers them into the same tfjs-core); webpack is
 * told to leave that import alone, so it never enters the add-in's bundles.
 */
export function registerGradients(): Promise<unknown> {
  if (gradients === null) {
    const g = globalThis as { process?: { versions?: { node?: string } }; window?: unknown };
    const node = typeof g.window === 'undefined' && typeof g.process?.versions?.node === 'string';
    gradients = node ? import(/* webpackIgnore: true */ '@tensorflow/tfjs') : import('@tensorflow/tfjs-core/dist/register_all_gradients');
  }
  return gradients;
}

/**
 * Switches tfjs to the requested backend, falling back to 'cpu' when the wasm
 * binaries cannot be loaded (the reason is returned so the fit can say so).
 * tfjs has one global backend, so fits are run one at a time through `exclusive`.
 * @returns the backend in use and, on fallback, why wasm was not used.
 * @throws RemapError (kind 'num') when not even the cpu backend starts.
 */
export async function activateBackend(wanted: BackendName): Promise<{ backend: BackendName; fallback: string | null }> {
  await registerGradients();
  if (backendOptions.pathChanged && backendOptions.wasmPath !== undefined) {
    setWasmPaths(backendOptions.wasmPath);
    backendOptions.pathChanged = false;
    wasmFailed = null;
  }
  const name: BackendName = backendOptions.prefer === 'cpu' ? 'cpu' : wanted;
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

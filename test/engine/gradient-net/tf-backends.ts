/**
 * TensorFlow.js as the product loads it (the core with its gradients and the cpu
 * and wasm backends, src/engine/gradient-net/activate-backend.ts), for tests that
 * run on both backends the product offers.
 */
import * as tf from '@tensorflow/tfjs-core';
import { registerGradients } from '../../../src/engine/gradient-net/activate-backend';

export { tf };

/** The tensor backends the product offers. */
export const BACKENDS = ['cpu', 'wasm'] as const;

/** Switches the global backend (the product does this per fit in activateBackend). */
export async function useBackend(name: (typeof BACKENDS)[number]): Promise<void> {
  await registerGradients();
  await tf.setBackend(name);
  await tf.ready();
}

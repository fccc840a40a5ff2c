import { tf } from './tf-backends';
import { activateBackend } from '../../../src/engine/gradient-net/activate-backend';
import { configureBackend, exclusive } from '../../../src/engine/gradient-net/backend';

describe('backend selection', () => {
  test('configureBackend rejects an empty path and an unknown backend', () => {
    expect(() => configureBackend({ wasmPath: ' ' })).toThrow(/wasmPath must be a folder path/);
    expect(() => configureBackend({ prefer: 'gpu' as never })).toThrow(/prefer must be "wasm" or "cpu"/);
  });

  test('wasm loads from node_modules without a path; prefer cpu forces cpu', async () => {
    expect((await activateBackend('wasm')).backend).toBe('wasm');
    expect(tf.getBackend()).toBe('wasm');
    configureBackend({ prefer: 'cpu' });
    expect((await activateBackend('wasm')).backend).toBe('cpu');
    expect(tf.getBackend()).toBe('cpu');
    configureBackend({ prefer: 'wasm' });
    expect((await activateBackend('cpu')).backend).toBe('cpu');
  });

  test('exclusive runs jobs one after another, even after a failure', async () => {
    const order: number[] = [];
    const a = exclusive(async () => {
      await new Promise((r) => setTimeout(r, 20));
      order.push(1);
      throw new Error('x');
    });
    const b = exclusive(async () => order.push(2));
    await expect(a).rejects.toThrow('x');
    await b;
    expect(order).toEqual([1, 2]);
  });
});

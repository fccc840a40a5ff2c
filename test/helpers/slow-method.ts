import { RemapError } from '../../src/engine/errors';
import type { FitContext, MethodName, TransportMap } from '../../src/engine/map';
import type { MethodSpec } from '../../src/engine/method';
import { quantileMethod } from '../../src/engine/quantile/quantile-method';

const tick = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * A stand-in for a method that trains in the background: `steps` steps of
 * 5 ms, reporting progress and honouring the signal like the engine's trained
 * methods, then the quantile map. Tests put it in the method list with
 * `jest.mock` of a trained method's module, under that method's name.
 */
export function slowMethod(name: MethodName): MethodSpec {
  return {
    ...quantileMethod,
    name,
    background: true,
    settings: [{ name: 'steps', type: 'integer', default: 40, min: 1, max: 1000, describe: 'steps' }],
    fit: async (s, t, settings, ctx: FitContext): Promise<TransportMap> => {
      const steps = Number(settings.steps);
      const t0 = Date.now();
      for (let i = 0; i < steps; i++) {
        if (ctx.signal?.aborted) throw new RemapError(`fit (${name}): cancelled at step ${i}.`, 'cancelled');
        await tick(5);
        ctx.onProgress?.({ step: i + 1, of: steps, loss: 1 / (i + 1), elapsedMs: Date.now() - t0 });
      }
      return quantileMethod.fit(s, t, { tails: 'clamp' }, ctx) as TransportMap;
    },
  };
}

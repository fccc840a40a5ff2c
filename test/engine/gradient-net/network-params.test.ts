import { checkNetworkParams } from '../../../src/engine/gradient-net/network-params';
import { randomParams } from './helpers';

describe('checkNetworkParams', () => {
  test('accepts complete finite parameters', () => {
    expect(() => checkNetworkParams(randomParams(2, 4, 2, 1), 'load')).not.toThrow();
  });

  test('names the damaged field: wrong size, non-finite value, non-positive alpha', () => {
    const p = randomParams(2, 4, 1, 1);
    expect(() => checkNetworkParams({ ...p, w: new Float64Array(3) }, 'load')).toThrow(/w should hold 8 numbers/);
    expect(() => checkNetworkParams({ ...p, beta: Float64Array.of(1, NaN) }, 'load')).toThrow(/beta\[1\] is not finite/);
    expect(() => checkNetworkParams({ ...p, alpha: 0 }, 'load')).toThrow(/alpha = 0 must be positive/);
  });
});

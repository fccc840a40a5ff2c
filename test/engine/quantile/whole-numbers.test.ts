import { checkWholeNumbers, MAX_WHOLE_SCORE } from '../../../src/engine/quantile/whole-numbers';

describe('quantile/whole-numbers', () => {
  test('whole numbers, negative ones included, pass', () => {
    expect(() => checkWholeNumbers(Float64Array.of(-3, 0, 7), 'fit (ordinal): source')).not.toThrow();
  });

  test('a fraction names the row and value and points to method quantile', () => {
    expect(() => checkWholeNumbers(Float64Array.of(1, 2.5), 'fit (ordinal): source')).toThrow(
      /fit \(ordinal\): source, row 2 holds 2.5, which is not a whole number.*Use method quantile/,
    );
  });

  test('a score too large for exact half-points is refused', () => {
    expect(() => checkWholeNumbers(Float64Array.of(MAX_WHOLE_SCORE * 4), 'x')).toThrow(/larger than/);
  });
});

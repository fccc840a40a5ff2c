import type { Diagnostics } from '../../src/engine/map';
import { diagnosticsInWords, num, warningsInWords } from '../../src/taskpane/plain-words';

const diag: Diagnostics = Object.freeze({
  method: 'entropic',
  settings: {},
  n: { source: 500, target: 600 },
  d: 2,
  columns: ['income', 'age'],
  dropped: { source: 3, target: 0 },
  cost: { kind: 'sinkhorn-divergence', w2Squared: 1.5, w2: Math.sqrt(1.5), note: 'The debiased cost.', bound: 'estimate', label: 'squared W2, estimate' },
  energyBefore: 0.4,
  energyAfter: 0.01,
  ksMaxAfter: 0.034,
  minJacobianEigenvalue: 0.2,
  convergence: { iterations: 230, finalError: 1e-7, converged: true, criterion: 'marginal error' },
  outside: 'every result stays inside the target hull',
  warnings: [{ code: 'rows-dropped', message: '3 source entries were skipped.', action: 'Check the ranges.' }],
  reminder: 'A statistical estimate.',
}) as Diagnostics;

describe('diagnostics in plain words', () => {
  test('say what was moved, the cost, the closeness after mapping, monotonicity and convergence', () => {
    const lines = diagnosticsInWords(diag);
    expect(lines[0]).toBe('Moved 500 source rows onto 600 target rows (2 columns: income, age) with the entropic method.');
    expect(lines.join(' ')).toMatch(/3 source and 0 target entries were skipped/);
    expect(lines.join(' ')).toMatch(/squared W2 = 1.5 \(W2 = 1.225/);
    // Source: arithmetic: 1 - 0.01 / 0.4 = 97.5%, rounded to 98%
    expect(lines.join(' ')).toMatch(/98% of the gap closed/);
    expect(lines.join(' ')).toMatch(/at most 3.4 percentage points/);
    expect(lines.join(' ')).toMatch(/keeps the order of values/);
    expect(lines.join(' ')).toMatch(/converged after 230 iterations/);
  });

  test('warnings carry a title and what to do', () => {
    expect(warningsInWords(diag.warnings)).toEqual([{ title: 'Entries skipped', text: '3 source entries were skipped.', action: 'Check the ranges.' }]);
  });

  test('numbers keep four significant digits', () => {
    expect(num(1234.5678)).toBe('1235');
    expect(num(0.000123)).toBe('1.230e-4');
    expect(num(0)).toBe('0');
  });
});

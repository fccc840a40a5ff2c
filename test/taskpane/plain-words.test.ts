import type { Diagnostics } from '../../src/engine/map';
import { costInWords, diagnosticsInWords, num, warningsInWords } from '../../src/taskpane/plain-words';

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
  comparison: {
    basis: 'fitting rows',
    ks: { source: 500, target: 600 },
    energy: { source: 500, target: 600 },
    seed: null,
    note: "Measured on this map's own fitting rows (500 source, 600 target).",
  },
  effectiveSize: { source: 123.4, target: 600 },
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
    // Source: design choice (the figure follows its label; an estimate's square root is not called W2)
    expect(lines.join(' ')).toContain('Transport cost (squared W2, estimate): 1.5. The debiased cost.');
    expect(lines.join(' ')).not.toMatch(/W2 = /);
    // Source: arithmetic: 1 - 0.01 / 0.4 = 97.5%, rounded to 98%
    expect(lines.join(' ')).toMatch(/98% of the gap closed/);
    expect(lines.join(' ')).toMatch(/at most 3.4 percentage points/);
    expect(lines.join(' ')).toMatch(/keeps the order of values/);
    expect(lines.join(' ')).toMatch(/converged after 230 iterations/);
  });

  test('say the effective sizes, the rows the comparison used and what happens outside the fitted range', () => {
    const text = diagnosticsInWords(diag).join(' ');
    // Source: design choice (Kish's effective size, 3 significant digits, shown because it differs from the 500 rows)
    expect(text).toMatch(/the 500 source rows count as about 123 and the 600 target rows as about 600/);
    expect(text).toContain("Measured on this map's own fitting rows (500 source, 600 target).");
    expect(text).toContain('Outside the fitted range: every result stays inside the target hull.');
    const unweighted = diagnosticsInWords({ ...diag, effectiveSize: { source: 500, target: 600 } }).join(' ');
    expect(unweighted).not.toMatch(/effective sample size/);
  });

  test('an exact cost is called squared W2 with its square root; a lower bound is not', () => {
    // Source: worked by hand: sqrt(378) = 19.44
    const exact = costInWords({ kind: 'exact-1d', w2Squared: 378, w2: Math.sqrt(378), note: '', bound: 'exact', label: 'squared W2, exact' });
    expect(exact).toBe('Transport cost (squared W2, exact): 378 (W2 = 19.44, the typical distance a value moves).');
    const lower = costInWords({
      kind: 'bures',
      w2Squared: 5,
      w2: Math.sqrt(5),
      note: 'Closed form.',
      bound: 'lower',
      label: 'squared W2, lower bound (Gelbrich)',
    });
    // Source: design choice
    expect(lower).toBe('Transport cost (squared W2, lower bound (Gelbrich)): 5. Closed form.');
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

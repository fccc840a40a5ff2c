import { prepareFit } from '../../../src/engine/methods';
import { sample } from '../../../src/engine/points';
import { fitOneColumnMap, restoreOneColumnMap, type ColumnRecipe } from '../../../src/engine/quantile/fit-columns';
import { quantileColumn, quantileColumnFromParams } from '../../../src/engine/quantile/quantile-column';
import { quantileMethod } from '../../../src/engine/quantile/quantile-method';

const recipe: ColumnRecipe = { method: 'quantile', build: (s, t, w) => quantileColumn(s, t, w), restore: quantileColumnFromParams, warnTies: true };

describe('quantile/fit-columns', () => {
  const s = sample([1, 2, 2, 3]);
  const t = sample([4, 5, 6, 8]);
  const settings = prepareFit(quantileMethod, s, t, {});

  test('the header records sizes, dropped rows and column names from the context', () => {
    const m = fitOneColumnMap(recipe, s, t, settings, { dropped: { source: 1, target: 0 }, columns: ['Score'] });
    const d = m.diagnostics();
    expect(d.n).toEqual({ source: 4, target: 4 });
    expect(d.dropped).toEqual({ source: 1, target: 0 });
    expect(d.columns).toEqual(['Score']);
    const codes = d.warnings.map((w) => w.code);
    expect(codes).toEqual(expect.arrayContaining(['small-sample', 'rows-dropped', 'ties']));
    expect(d.warnings.find((w) => w.code === 'ties')?.message).toMatch(/2 of 4 in column "Score"/);
  });

  test('restoreOneColumnMap refuses params with the wrong number of columns', () => {
    const json = fitOneColumnMap(recipe, s, t, settings, {}).toJSON();
    expect(() => restoreOneColumnMap(recipe, { ...json, params: { columns: [] } })).toThrow(/should hold 1 fitted column/);
  });
});

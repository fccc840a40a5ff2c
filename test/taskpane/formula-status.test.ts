import type { Diagnostics } from '../../src/engine/map';
import { ESTIMATE_REMINDER, formulaStatus, remapFunctionOf } from '../../src/taskpane/formula-status';

/** Diagnostics as a fitted map reports them; only the warnings matter here. */
function diag(warnings: Diagnostics['warnings']): Diagnostics {
  return { warnings } as unknown as Diagnostics;
}

describe('what the pane says about each REMAP formula in the workbook', () => {
  test('finds the REMAP function a formula calls, also inside other functions and in lower case', () => {
    // Source: Excel formula syntax (function names are case-insensitive; calls may nest)
    expect(remapFunctionOf('=REMAP.VALUES(B2:B9,B2:B9,C2:C9)')).toBe('VALUES');
    expect(remapFunctionOf('=ROUND(remap.cost(A1:A9, B1:B9), 2)')).toBe('COST');
    expect(remapFunctionOf('=SUM(A1:A3)')).toBe('');
  });

  test("a REMAP.VALUES cell lists its map's warnings in words with what to do", () => {
    // Source: design choice (the warnings a user of REMAP.VALUES would otherwise never see)
    const s = formulaStatus('=REMAP.VALUES(B2:B9,B2:B9,C2:C9)', diag([{ code: 'small-sample', message: 'Only 8 source rows.', action: 'Add rows.' }]));
    expect(s.kind).toBe('warnings');
    expect(s.lines).toEqual([{ title: 'Small sample', text: 'Only 8 source rows. What to do: Add rows.' }]);
  });

  test('a map with no warnings still gets the reminder that it is an estimate to check', () => {
    // Source: design choice (no warning is not the same as validated)
    const s = formulaStatus('=REMAP.COST(A1:A9,B1:B9)', diag([]));
    expect(s.kind).toBe('clean');
    expect(s.lines[0].text).toBe(ESTIMATE_REMINDER);
    expect(ESTIMATE_REMINDER).toMatch(/estimate/);
  });

  test('a fitting formula whose map this session does not know says how to see its warnings', () => {
    // Source: design choice
    const s = formulaStatus('=REMAP.FIT(A1:A9,B1:B9)', undefined);
    expect(s.kind).toBe('unknown');
    expect(s.lines[0].text).toMatch(/Recalculate/);
  });

  test('APPLY points to the cell whose map it uses; GAUSSCOST fits no map', () => {
    // Source: design choice (APPLY/INVERT/REPORT/SAVE use the map held in another cell)
    expect(formulaStatus('=REMAP.APPLY(F2,A2:A9)', undefined).kind).toBe('other');
    expect(formulaStatus('=REMAP.GAUSSCOST(0,1,0,4)', undefined).lines[0].title).toBe('Closed form');
  });
});

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
    expect(ESTIMATE_REMINDER).toMatch(/^No warnings\. .*estimate/);
  });

  test('a fitting formula whose map this session does not know says how to see its warnings', () => {
    // Source: design choice
    const s = formulaStatus('=REMAP.FIT(A1:A9,B1:B9)', undefined);
    expect(s.kind).toBe('unknown');
    expect(s.lines[0].text).toMatch(/Recalculate/);
  });

  test("an APPLY cell shows the warning about its own values outside the fitted range, and points to the map's cell", () => {
    // Source: design choice (per-call warnings live with the cell, never in the map's report)
    const outside = { code: 'extrapolation' as const, message: '2 of 3 rows (66.7%) lay outside the source range.', action: 'Treat them with caution.' };
    const s = formulaStatus('=REMAP.APPLY(F2,A2:A4)', undefined, [outside]);
    expect(s.kind).toBe('warnings');
    expect(s.lines[0]).toEqual({
      title: 'Values outside the fitted range',
      text: '2 of 3 rows (66.7%) lay outside the source range. What to do: Treat them with caution.',
    });
    expect(s.lines[1].title).toMatch(/another cell/);
    expect(formulaStatus('=REMAP.INVERT(F2,A2:A4)', undefined, []).kind).toBe('other');
    expect(formulaStatus('=REMAP.INVERT(F2,A2:A4)', undefined, undefined).kind).toBe('unknown');
  });

  test("a VALUES cell with a clean map but values outside its range lists the call's warning, not the no-warnings line", () => {
    // Source: design choice
    const outside = { code: 'extrapolation' as const, message: '1 of 4 rows lay outside.', action: 'Check them.' };
    const s = formulaStatus('=REMAP.VALUES(A1:A4,B1:B9,C1:C9)', diag([]), [outside]);
    expect(s.kind).toBe('warnings');
    expect(s.lines.map((l) => l.title)).toEqual(['Values outside the fitted range']);
  });

  test('APPLY points to the cell whose map it uses; GAUSSCOST fits no map', () => {
    // Source: design choice (APPLY/INVERT/REPORT/SAVE use the map held in another cell)
    expect(formulaStatus('=REMAP.APPLY(F2,A2:A9)', undefined, []).kind).toBe('other');
    expect(formulaStatus('=REMAP.REPORT(F2)', undefined).kind).toBe('other');
    expect(formulaStatus('=REMAP.GAUSSCOST(0,1,0,4)', undefined).lines[0].title).toBe('Closed form');
  });

  test("maps by group: FITGROUPS and BYGROUP list their groups' warnings; APPLYGROUPS and GROUPREPORT point to the map cell", () => {
    const facts = {
      warnings: [{ code: 'small-sample', message: 'Group "North": The source has 8 usable rows.', action: 'Give more rows.' }],
      reminder: ESTIMATE_REMINDER,
    };
    // Source: design choice (a map by group's warnings are listed with the cell that fits it)
    const fit = formulaStatus('=REMAP.FITGROUPS(B2:B90,A2:A90,D2:D90,C2:C90)', facts as never);
    expect(fit.kind).toBe('warnings');
    expect(fit.lines[0].text).toMatch(/Group "North"/);
    expect(formulaStatus('=REMAP.BYGROUP(F2:F9,E2:E9,B2:B90,A2:A90,D2:D90,C2:C90)', undefined).kind).toBe('unknown');
    expect(formulaStatus('=REMAP.APPLYGROUPS(H1,F2:F9,E2:E9)', undefined).kind).toBe('other');
    expect(formulaStatus('=REMAP.GROUPREPORT(H1)', undefined).lines[0].title).toBe('Uses another cell\u2019s map');
  });
});

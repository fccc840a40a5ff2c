import { makeFrame, px, textWidth } from '../../src/plots/frame';
import { xmlProblem } from './well-formed';

describe('makeFrame', () => {
  test('maps the tick range onto the plot area: the first tick to the left/bottom edge, the last to the right/top', () => {
    // Source: definition of a linear axis scale
    const f = makeFrame({ width: 640 }, [3, 97], [-1, 1], []);
    expect(f.x(f.xTicks.lo)).toBeCloseTo(f.left, 9);
    expect(f.x(f.xTicks.hi)).toBeCloseTo(f.right, 9);
    expect(f.y(f.yTicks.lo)).toBeCloseTo(f.bottom, 9);
    expect(f.y(f.yTicks.hi)).toBeCloseTo(f.top, 9);
    expect(f.xTicks.lo).toBeLessThanOrEqual(3);
    expect(f.xTicks.hi).toBeGreaterThanOrEqual(97);
  });
  test('a pane-width frame (300 px) uses a smaller font and wraps a long legend onto more lines', () => {
    // Source: common practice (legibility at pane width)
    const legend = ['wave 1 (target)', 'wave 2 as asked', 'wave 2 harmonised'].map((name) => ({ name, colour: '#000000', mark: 'line' as const }));
    const narrow = makeFrame({ width: 300, title: 't' }, [0, 1], [0, 1], legend);
    const wide = makeFrame({ width: 640, title: 't' }, [0, 1], [0, 1], legend);
    expect(narrow.fontSize).toBeLessThan(wide.fontSize);
    expect(narrow.top).toBeGreaterThan(wide.top);
    expect(xmlProblem(narrow.head + narrow.tail)).toBeNull();
  });
  test('clamps absurd sizes into 200..2000 px', () => {
    // Source: the documented range of PlotOptions.width
    expect(makeFrame({ width: 5 }, [0, 1], [0, 1], []).width).toBe(200);
    expect(makeFrame({ width: 1e9 }, [0, 1], [0, 1], []).width).toBe(2000);
  });
  test('px writes at most two decimals and no negative zero', () => {
    // Source: worked examples
    expect(px(1.23456)).toBe('1.23');
    expect(px(-0.001)).toBe('0');
    expect(textWidth('abcd', 10)).toBeCloseTo(23.2, 9);
  });
});

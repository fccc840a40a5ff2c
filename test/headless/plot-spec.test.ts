import { renderPlot } from '../../src/headless/plot-spec';
import { count, xmlProblem } from '../plots/well-formed';

const values = {
  S: [
    ['x', 'y', 'w'],
    [1, 10, 1],
    [2, 30, 2],
    [3, 20, 1],
  ],
};

describe('renderPlot', () => {
  test.each(['ecdf', 'histogram', 'qq'] as const)('draws a well-formed %s plot from computed ranges', (kind) => {
    // Source: the function's contract
    const svg = renderPlot(
      {
        file: 'p.svg',
        kind,
        title: 't',
        series: [
          { name: 'x', range: 'S!A2:A4', weights: 'S!C2:C4' },
          { name: 'y', range: 'S!B2:B4' },
        ],
      },
      values,
    );
    expect(xmlProblem(svg)).toBeNull();
  });
  test('a scatter takes x from range and y from y, one circle per row', () => {
    // Source: the function's contract
    const svg = renderPlot({ file: 'p.svg', kind: 'scatter', title: 't', series: [{ name: 'xy', range: 'S!A2:A4', y: 'S!B2:B4' }] }, values, 300);
    expect(count(svg, 'class="pt"')).toBe(3);
    expect(() => renderPlot({ file: 'p.svg', kind: 'scatter', title: 't', series: [{ name: 'xy', range: 'S!A2:A4' }] }, values)).toThrow(/needs a y range/);
  });
});

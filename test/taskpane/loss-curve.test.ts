import { lossCurve } from '../../src/taskpane/loss-curve';

describe('lossCurve', () => {
  test('draws one polyline through every finite point, on a log scale when losses span more than 10x', () => {
    const svg = lossCurve(
      Object.freeze([
        [1, 100],
        [2, 10],
        [3, NaN],
        [4, 1],
      ]) as [number, number][],
      200,
      50,
    );
    expect(svg.match(/points="([^"]*)"/)?.[1].split(' ')).toHaveLength(3);
    expect(svg).toContain('(log scale)');
    // Source: log10 spacing: 100, 10, 1 are evenly spaced in y on a log scale
    const ys = svg
      .match(/points="([^"]*)"/)![1]
      .split(' ')
      .map((p) => Number(p.split(',')[1]));
    expect(ys[1] - ys[0]).toBeCloseTo(((ys[2] - ys[0]) * 1) / 2, 0);
  });

  test('says so instead of drawing with fewer than two points', () => {
    expect(lossCurve([[1, 2]])).toContain('after two reports');
  });
});

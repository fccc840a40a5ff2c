import { PlateauDetector } from '../../../src/engine/gradient-net/plateau';

describe('PlateauDetector', () => {
  test('a steadily falling loss never plateaus; a flat one does after the patience', () => {
    const det = new PlateauDetector({ window: 10, patience: 30 });
    for (let i = 0; i < 300; i++) expect(det.push(100 * Math.exp(-i / 20))).toBe(false);
    const flat = new PlateauDetector({ window: 10, patience: 30 });
    let at = -1;
    for (let i = 0; i < 300 && at < 0; i++) if (flat.push(1)) at = i + 1;
    expect(at).toBe(40); // Source: first check sets the best (10), then 3 checks without improvement (40)
  });

  test('the smoothed value is bias-corrected (a constant loss smooths to itself)', () => {
    const det = new PlateauDetector();
    expect(Number.isNaN(det.smoothed)).toBe(true);
    det.push(2);
    expect(det.smoothed).toBeCloseTo(2, 14); // Source: Kingma & Ba arXiv 1412.6980 sec. 3 bias correction
  });
});

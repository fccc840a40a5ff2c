import { PALETTE, seriesColour } from '../../src/plots/palette';

describe('palette', () => {
  test('series colours cycle through the palette, starting with blue then orange', () => {
    // Source: Okabe & Ito, "Color Universal Design" (2008): blue #0072B2 and orange #E69F00
    expect(seriesColour(0)).toBe('#0072B2');
    expect(seriesColour(1)).toBe('#E69F00');
    expect(seriesColour(PALETTE.length)).toBe(PALETTE[0]);
    expect(new Set(PALETTE).size).toBe(PALETTE.length);
    for (const c of PALETTE) expect(c).toMatch(/^#[0-9A-F]{6}$/);
  });
});

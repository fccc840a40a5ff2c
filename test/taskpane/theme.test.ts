import { relativeLuminance, themeFor } from '../../src/taskpane/theme';

describe("the pane follows Office's theme", () => {
  test('relative luminance of sRGB colours', () => {
    // Source: WCAG 2.1, definition of relative luminance (white 1, black 0; #808080 about 0.2159)
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 12);
    expect(relativeLuminance('#000000')).toBe(0);
    expect(relativeLuminance('#808080')).toBeCloseTo(0.2159, 4);
    expect(relativeLuminance('red')).toBeNaN();
  });

  test("Office's dark theme colours make a dark pane with Office's body and control colours", () => {
    // Source: design choice (dark below mid grey's luminance)
    const t = themeFor({ bodyBackgroundColor: '#262626', bodyForegroundColor: '#ffffff', controlBackgroundColor: '#3a3a3a' });
    expect(t.dark).toBe(true);
    expect(t.variables).toEqual({ '--surface': '#262626', '--ink': '#ffffff', '--panel': '#3a3a3a' });
  });

  test('a light theme stays light; colours that are not #rrggbb are ignored', () => {
    // Source: design choice
    const t = themeFor({ bodyBackgroundColor: '#ffffff', bodyForegroundColor: 'windowtext' });
    expect(t.dark).toBe(false);
    expect(t.variables).toEqual({ '--surface': '#ffffff' });
  });
});

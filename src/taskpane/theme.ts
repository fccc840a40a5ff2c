/**
 * The pane follows Office's theme: Office.context.officeTheme gives the body
 * and control colours of the current Office theme, which become the pane's CSS
 * variables; a dark theme also switches the accent and warning colours
 * (data-theme="dark" in taskpane.css). High-contrast modes need nothing here:
 * the CSS follows them through the forced-colors media query.
 */

/** The colours Office reports (Office.OfficeTheme), as "#rrggbb" text. */
export interface OfficeColours {
  readonly bodyBackgroundColor?: string;
  readonly bodyForegroundColor?: string;
  readonly controlBackgroundColor?: string;
  readonly controlForegroundColor?: string;
}

/**
 * The relative luminance of an sRGB colour "#rrggbb" (WCAG 2.x definition),
 * or NaN for text that is not such a colour. O(1).
 * @example relativeLuminance('#ffffff') // 1
 */
export function relativeLuminance(hex: string): number {
  const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex.trim());
  if (!m) return NaN;
  const lin = (h: string) => {
    const c = parseInt(h, 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(m[1]) + 0.7152 * lin(m[2]) + 0.0722 * lin(m[3]);
}

/**
 * The pane's CSS variables and theme for Office's colours: only the colours
 * Office gives are set; dark when the body background's luminance is below that
 * of mid grey. Pure; O(1).
 * @example themeFor({ bodyBackgroundColor: '#262626', bodyForegroundColor: '#ffffff' }).dark // true
 */
export function themeFor(c: OfficeColours): { dark: boolean; variables: Record<string, string> } {
  const variables: Record<string, string> = {};
  const put = (name: string, v: string | undefined) => {
    if (v && Number.isFinite(relativeLuminance(v))) variables[name] = v;
  };
  put('--surface', c.bodyBackgroundColor);
  put('--ink', c.bodyForegroundColor);
  put('--panel', c.controlBackgroundColor);
  const bg = relativeLuminance(c.bodyBackgroundColor ?? '');
  return { dark: Number.isFinite(bg) && bg < relativeLuminance('#808080'), variables };
}

/** Applies Office's current theme to the page, and again whenever Office says it changed (where the host can). */
export function followOfficeTheme(): void {
  if (typeof Office === 'undefined' || !Office.context) return;
  const apply = (): void => {
    const theme = (Office.context as { officeTheme?: OfficeColours }).officeTheme;
    if (!theme) return;
    const { dark, variables } = themeFor(theme);
    const root = document.documentElement;
    for (const [k, v] of Object.entries(variables)) root.style.setProperty(k, v);
    if (dark) root.dataset.theme = 'dark';
    else delete root.dataset.theme;
  };
  apply();
  try {
    const doc = Office.context.document as unknown as { addHandlerAsync?(type: string, handler: () => void): void };
    doc?.addHandlerAsync?.('officeThemeChanged', apply);
  } catch {
    /* the host does not report theme changes: the theme read at start stays */
  }
}

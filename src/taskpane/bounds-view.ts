import { recall } from '../fits';
import type { Band } from '../plots/band';
import { boundsBand } from './bounds-band';
import { $, messageOf, setStatus } from './dom';
import type { PlotData } from './plots-view';

/** Bootstrap refits behind the pane's band (design choice: fewer than REMAP.BOUNDS's 1,000, so the pane answers within about a second). */
export const PANE_BAND_REPLICATES = 200;

let cached: { key: string; band: Band | null } | null = null;

/**
 * The band for the shown fit when "Show 95 % bounds" is ticked: the method is
 * read from the handle, the settings from the map kept this session. Null when
 * unticked, for several columns, or for a method without bounds (the status
 * line says why). The band of one handle is computed once.
 */
export function shownBand(shown: PlotData & { handle: string }): Band | null {
  const box = document.getElementById('plot-bounds') as HTMLInputElement | null;
  if (!box || !box.checked) return null;
  if (cached && cached.key === shown.handle) return cached.band;
  const method = shown.handle.split(':')[1] ?? '';
  let band: Band | null = null;
  try {
    const settings = recall(shown.handle)?.diagnostics().settings ?? {};
    band = boundsBand(method, shown.source, shown.target, settings, { replicates: PANE_BAND_REPLICATES, of: 'mapped source' });
    if (!band) setStatus(`Bounds are drawn for one column with the quantile, step or ordinal method; this map is ${method} on ${shown.source.d} column(s).`);
  } catch (e) {
    setStatus(`Could not compute the bounds: ${messageOf(e)}`, true);
    $<HTMLInputElement>('plot-bounds').checked = false;
  }
  cached = { key: shown.handle, band };
  return band;
}

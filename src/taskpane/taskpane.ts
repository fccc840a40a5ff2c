/**
 * The placeholder Remap pane. It lists the worksheet functions by reading functions.json, the metadata the
 * build generates from the functions' JSDoc, so the list can never drift from what Excel registers.
 * The full pane (selections, fits, progress, plots) replaces this later.
 */

/** The namespace Excel puts before every function name (manifest.xml, Functions.Namespace). */
const NAMESPACE = 'REMAP';

/** One worksheet function as the pane lists it. */
export interface ListedFunction {
  /** The name typed in a cell after the namespace, e.g. "VALUES". */
  readonly name: string;
  /** The one-line description from the function's JSDoc ("" when it has none). */
  readonly description: string;
}

/**
 * Picks the listed functions out of parsed functions.json, sorted by name. Entries without a string
 * name are skipped rather than shown half-formed. O(f log f) for f functions.
 * @param metadata the parsed functions.json: `{ functions: [{ name, description, ... }] }`
 * @returns the functions to list; [] when `metadata` has no functions array
 * @example listedFunctions({ functions: [{ id: 'VALUES', name: 'VALUES', description: 'Maps values.' }] })
 *   // [{ name: 'VALUES', description: 'Maps values.' }]
 */
export function listedFunctions(metadata: unknown): ListedFunction[] {
  const functions = (metadata as { functions?: unknown } | null)?.functions;
  if (!Array.isArray(functions)) return [];
  const out: ListedFunction[] = [];
  for (const f of functions as Array<{ name?: unknown; description?: unknown }>) {
    if (typeof f?.name !== 'string' || f.name === '') continue;
    out.push({ name: f.name, description: typeof f.description === 'string' ? f.description : '' });
  }
  return out.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
}

/** Fills the list element with one item per function (text only, never HTML). */
function renderList(list: HTMLElement, functions: readonly ListedFunction[]): void {
  list.replaceChildren(
    ...functions.map((f) => {
      const item = document.createElement('li');
      const code = document.createElement('code');
      code.textContent = `${NAMESPACE}.${f.name}`;
      item.append(code);
      if (f.description) item.append(` \u2014 ${f.description}`);
      return item;
    }),
  );
}

function setStatus(text: string): void {
  const status = document.getElementById('status');
  if (status) status.textContent = text;
}

async function showFunctions(): Promise<void> {
  const list = document.getElementById('function-list');
  if (!list) return;
  try {
    // Same origin as the page, so the content security policy (connect-src 'self') allows it.
    const response = await fetch('functions.json', { cache: 'no-cache' });
    if (!response.ok) throw new Error(`HTTP ${response.status}`);
    const functions = listedFunctions(await response.json());
    renderList(list, functions);
    if (functions.length === 0) setStatus('No worksheet functions are registered yet.');
  } catch (err) {
    list.replaceChildren();
    setStatus(`Could not read the function list (${err instanceof Error ? err.message : String(err)}).`);
  }
}

function start(): void {
  void showFunctions();
}

// In Excel, wait for Office to be ready; opened in a plain browser (no office.js), just show the page.
if (typeof Office !== 'undefined' && typeof Office.onReady === 'function') {
  void Office.onReady(() => start());
} else if (typeof document !== 'undefined') {
  document.addEventListener('DOMContentLoaded', start);
}

/** One worksheet function as the pane lists it. */
export interface ListedFunction {
  /** The name typed in a cell after the namespace, e.g. "VALUES". */
  readonly name: string;
  /** The one-line description from the function's JSDoc ("" when it has none). */
  readonly description: string;
}

/**
 * Picks the listed functions out of parsed functions.json (the metadata the
 * build generates from the functions' JSDoc, so the list cannot drift from what
 * Excel registers), sorted by name. Entries without a string name are skipped.
 * O(f log f) for f functions.
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

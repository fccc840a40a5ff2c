/** The element with this id (the pane's page has every id it asks for). */
export const $ = <T extends HTMLElement = HTMLElement>(id: string): T => document.getElementById(id) as T;

/** Plots' width in the pane (px): fits Office's default pane width. */
export const PLOT_WIDTH = 290;

/** Shows a line in the status area; `bad` marks it as an error. */
export function setStatus(text: string, bad = false): void {
  const s = $('status');
  s.textContent = text;
  s.classList.toggle('bad', bad);
}

/** An error's message, or the thrown value as text. */
export function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** A list item with text (and a class). */
export function listItem(text: string, className?: string): HTMLLIElement {
  const li = document.createElement('li');
  li.textContent = text;
  if (className) li.className = className;
  return li;
}

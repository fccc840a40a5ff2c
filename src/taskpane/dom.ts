/** The element with this id (the pane's page has every id it asks for). */
export const $ = <T extends HTMLElement = HTMLElement>(id: string): T => document.getElementById(id) as T;

/** Plots' width in the pane (px): fits Office's default pane width. */
export const PLOT_WIDTH = 290;

/**
 * Shows a line in the status area. An error (`bad`) goes to the alert line
 * (role=alert: screen readers read it at once); anything else to the status line
 * (role=status: read when the reader is idle), and clears the last error.
 */
export function setStatus(text: string, bad = false): void {
  const status = $('status');
  const alert = $('alert');
  if (bad) {
    status.textContent = '';
    alert.textContent = text;
    alert.hidden = false;
  } else {
    alert.textContent = '';
    alert.hidden = true;
    status.textContent = text;
  }
}

/** Says `text` to screen readers through the polite announcer, without showing it. */
export function announce(text: string): void {
  $('announcer').textContent = text;
}

/**
 * Redraws a list without losing the keyboard focus: when focus was on a control
 * inside `list` that has a data-focus-key, the control with the same key gets it
 * back; if that one is gone (its item was deleted), `fallback` does.
 */
export function redrawKeepingFocus(list: HTMLElement, items: readonly Node[], fallback: HTMLElement): void {
  const active = document.activeElement as HTMLElement | null;
  const key = active && list.contains(active) ? active.dataset.focusKey : undefined;
  list.replaceChildren(...items);
  if (key === undefined) return;
  const again = Array.from(list.querySelectorAll<HTMLElement>('[data-focus-key]')).find((e) => e.dataset.focusKey === key);
  (again ?? fallback).focus();
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

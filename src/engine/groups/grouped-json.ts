import { RemapError } from '../errors';
import type { MapJSON, TransportMap } from '../map';
import { checkMapJSON, MAX_MAP_JSON_CHARS } from '../map-json';
import { getMethod, restoreMap } from '../methods';
import { GroupedMap, type GroupEntry, type GroupedMapJSON, type GroupSizes } from './grouped-map';

const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** True when parsed JSON looks like a grouped map (its format tag), so a reader can choose between the two kinds. */
export function isGroupedMapJSON(raw: unknown): boolean {
  return typeof raw === 'object' && raw !== null && (raw as { format?: unknown }).format === 'remap.grouped-map';
}

/**
 * Reads grouped map JSON text (as `GroupedMap.toJSON` wrote it) as data only,
 * never evaluated: size-capped, prototype keys refused, the envelope checked,
 * and every group's map checked as `parseMapJSON` checks a single map.
 * Cost: O(length of text).
 * @throws RemapError saying what is wrong.
 */
export function parseGroupedMapJSON(text: string): GroupedMapJSON {
  if (typeof text !== 'string') throw new RemapError('Grouped map JSON must be text, as written by `remap fit-groups --out`.');
  if (text.length > MAX_MAP_JSON_CHARS)
    throw new RemapError(`Grouped map JSON is ${text.length} characters; the limit is ${MAX_MAP_JSON_CHARS}. Fit with fewer rows or groups.`);
  let raw: unknown;
  try {
    raw = JSON.parse(text, (key, value) => {
      if (FORBIDDEN_KEYS.has(key)) throw new RemapError(`Grouped map JSON has a forbidden key "${key}"; it was not written by Remap.`);
      return value;
    });
  } catch (e) {
    if (e instanceof RemapError) throw e;
    throw new RemapError(`Grouped map JSON could not be read (${(e as Error).message}); give the exact text \`remap fit-groups --out\` wrote.`);
  }
  return checkGroupedMapJSON(raw);
}

/** Checks an already parsed grouped map as `parseGroupedMapJSON` does. */
export function checkGroupedMapJSON(raw: unknown): GroupedMapJSON {
  const bad = (what: string): never => {
    throw new RemapError(`Grouped map JSON: ${what}; give the exact text \`remap fit-groups --out\` wrote.`);
  };
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) bad('the top level is not an object');
  const o = raw as Record<string, unknown>;
  if (o.format !== 'remap.grouped-map') bad('the "format" field is not "remap.grouped-map"');
  if (o.version !== 1) bad(`version ${String(o.version)} is not one this version of Remap reads (1)`);
  if (typeof o.method !== 'string') bad('"method" is missing');
  getMethod(o.method as string);
  if (!isCount(o.d, true) || (o.d as number) < 1) bad('"d" is not a column count');
  if (typeof o.settings !== 'object' || o.settings === null || Array.isArray(o.settings)) bad('"settings" is not an object');
  if (o.columns !== null && !(Array.isArray(o.columns) && o.columns.length === o.d && o.columns.every((c) => typeof c === 'string')))
    bad('"columns" is neither null nor one name per column');
  if (o.fallback !== 'none' && o.fallback !== 'pooled') bad('"fallback" is neither none nor pooled');
  if (!Array.isArray(o.groups) || o.groups.length === 0) bad('"groups" is not a non-empty list');
  const maps: MapJSON[] = [];
  const keys = new Set<string>();
  for (const g of o.groups as unknown[]) {
    const e = g as Record<string, unknown>;
    if (typeof e !== 'object' || e === null || typeof e.group !== 'string' || e.group === '') bad('a group has no name');
    if (keys.has(e.group as string)) bad(`group "${String(e.group)}" appears twice`);
    keys.add(e.group as string);
    for (const f of ['rows', 'effectiveRows', 'weight'] as const) {
      const v = e[f] as Record<string, unknown>;
      if (typeof v !== 'object' || v === null || !isCount(v.source, f === 'rows') || !isCount(v.target, f === 'rows'))
        bad(`group "${String(e.group)}": "${f}" is not a pair of sizes`);
    }
    if (e.map === null) {
      if (typeof e.reason !== 'string') bad(`group "${String(e.group)}" has neither a map nor a reason for the pooled one`);
      if (o.pooled === null || o.pooled === undefined) bad(`group "${String(e.group)}" uses the pooled map, but there is none`);
    } else {
      if (e.reason !== null) bad(`group "${String(e.group)}" has both a map and a reason`);
      maps.push(checkMapJSON(e.map));
    }
  }
  if (o.pooled !== null) maps.push(checkMapJSON(o.pooled));
  else if (o.fallback === 'pooled') bad('the fallback is pooled but the pooled map is missing');
  for (const m of maps) {
    if (m.method !== o.method) bad(`a group's map is a ${m.method} map, not ${String(o.method)}`);
    if (m.d !== o.d) bad(`a group's map takes ${m.d} columns, not ${String(o.d)}`);
  }
  return raw as GroupedMapJSON;
}

/**
 * Rebuilds a grouped map from checked JSON; every group's map through its
 * method's own `fromJSON`, so results are bit-identical to the fitted map's.
 * Cost: O(total parameters).
 * @throws RemapError from a group's method when its parameters are damaged.
 */
export function restoreGroupedMap(json: GroupedMapJSON): GroupedMap {
  const entries: GroupEntry[] = json.groups.map((g) => {
    const sizes: GroupSizes = { rows: g.rows, effectiveRows: g.effectiveRows, weight: g.weight };
    let map: TransportMap | null = null;
    if (g.map) {
      try {
        map = restoreMap(g.map);
      } catch (e) {
        if (e instanceof RemapError) throw new RemapError(`Grouped map JSON, group "${g.group}": ${e.message}`, e.kind);
        throw e;
      }
    }
    return { group: g.group, ...sizes, map, reason: g.reason };
  });
  const pooled = json.pooled ? restoreMap(json.pooled) : null;
  return new GroupedMap(json.method, json.d, json.columns, json.settings, json.fallback, entries, pooled);
}

function isCount(v: unknown, whole: boolean): boolean {
  return typeof v === 'number' && Number.isFinite(v) && v >= 0 && (!whole || Number.isInteger(v));
}

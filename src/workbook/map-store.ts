import { RemapError } from '../engine/errors';
import { Fingerprint } from '../engine/fingerprint';
import { isGroupedMapJSON, parseGroupedMapJSON } from '../engine/groups/grouped-json';
import { parseMapJSON } from '../engine/map-json';
import type { Keeper, KeptInfo } from '../fits';
import type { ExcelRun } from './excel-run';
import { SerialQueue } from '../common/serial-queue';
import { escapeXml, jsonSafeForXml, unescapeXmlText, xmlElements } from '../common/xml-text';

/**
 * Fitted maps kept inside the workbook file, so that after closing and
 * reopening it REMAP.APPLY on a handle gives the same values without fitting
 * again. The store is the source of truth shared by the worksheet functions
 * and the pane (on Excel on the web they may not share memory).
 *
 * Format: custom XML parts (ExcelApi 1.5), in two namespaces of our own.
 *  - One index part, `<maps xmlns="urn:remap:workbook-maps:1">`, with one
 *    `<map handle method rows target-rows cols cost saved chars check cell>`
 *    element per map and a `<part id="..."/>` child per chunk, in order.
 *  - Chunk parts, `<chunk xmlns="urn:remap:map-chunk:1" handle index of>` whose
 *    text is a slice of the map's JSON (XML-escaped).
 * Limits: Office.js requests and responses are limited to about 5 MB on Excel
 * on the web (Microsoft Learn, "Resource limits and performance optimization for
 * Office Add-ins"; from memory), so a map's JSON is cut into chunks of at most
 * CHUNK_CHARS characters (escaping can at most multiply that by 6 for a text
 * full of quotes, still under 5 MB), each written and read in its own request.
 * A map's JSON is at most MAX_MAP_JSON_CHARS (50 million characters, the
 * engine's parse limit). Document settings (Office.Settings) were not used:
 * they are one JSON blob for the whole add-in, loaded whole, and documented as
 * small (about 2 MB, from memory).
 *
 * Maps by group (REMAP.FITGROUPS, JSON format "remap.grouped-map") are kept
 * the same way, by their handle, with `grouped="1"` in the index; their rows
 * are summed over the groups and their cost is the source-weighted mean of the
 * groups' costs, as their report gives it. Their JSON is read with
 * parseGroupedMapJSON.
 *
 * Integrity: the index records each map's length and a fingerprint of its
 * text; a copy that does not match is refused with a message (never half-read),
 * and loading always goes through parseMapJSON (text is parsed as data, never
 * evaluated). Writes are serialised in this runtime, and a save writes the
 * chunks first and the index last, so an interrupted save leaves the previous
 * index intact (stray chunks are removed by the next save).
 */

export const INDEX_NAMESPACE = 'urn:remap:workbook-maps:1';
export const CHUNK_NAMESPACE = 'urn:remap:map-chunk:1';
/** Characters of map JSON per chunk part. */
export const CHUNK_CHARS = 500_000;

/** One kept map as the pane lists it. */
export interface KeptMap {
  readonly handle: string;
  readonly method: string;
  /** Source and target rows, and columns. */
  readonly rows: number;
  readonly targetRows: number;
  readonly cols: number;
  /** Squared W2 estimate recorded at fit time. */
  readonly cost: number;
  /** When it was kept (ISO 8601). */
  readonly saved: string;
  /** Length of its JSON text. */
  readonly chars: number;
  /** Fingerprint of its JSON text (14 hex digits). */
  readonly check: string;
  /** The REMAP.FIT cell that made it, when known ("Sheet1!F2"). */
  readonly cell: string;
  /** True for a map by group (REMAP.FITGROUPS; JSON format "remap.grouped-map"). */
  readonly grouped: boolean;
  /** Ids of its chunk parts, in order. */
  readonly parts: readonly string[];
}

export interface MapStoreOptions {
  /** Characters per chunk (tests use small chunks); 1,000 to CHUNK_CHARS. */
  readonly chunkChars?: number;
  /** The clock for the `saved` date (tests fix it). */
  readonly now?: () => Date;
}

/**
 * The workbook's map store; also the Keeper the worksheet functions use.
 * Every operation costs a few Office.js round trips plus one per chunk.
 */
export class WorkbookMapStore implements Keeper {
  private readonly run: ExcelRun;
  private readonly chunkChars: number;
  private readonly now: () => Date;
  private readonly queue = new SerialQueue();

  /**
   * @param run Excel.run or a test's fake of it.
   * @param options chunk size and clock.
   * @throws RemapError for a chunk size outside 1,000..CHUNK_CHARS.
   * @example new WorkbookMapStore(officeRun())
   */
  constructor(run: ExcelRun, options: MapStoreOptions = {}) {
    const chunk = options.chunkChars ?? CHUNK_CHARS;
    if (!(Number.isInteger(chunk) && chunk >= 1000 && chunk <= CHUNK_CHARS)) {
      throw new RemapError(`WorkbookMapStore: chunkChars must be a whole number from 1000 to ${CHUNK_CHARS}, not ${chunk}.`);
    }
    this.run = run;
    this.chunkChars = chunk;
    this.now = options.now ?? (() => new Date());
  }

  /** Runs `job` after every store operation started before it (one writer at a time in this runtime). */
  private serial<T>(job: () => Promise<T>): Promise<T> {
    return this.queue.run(job);
  }

  /**
   * Every kept map, newest first. O(#maps) after one round trip.
   * @example await store.list() // [{ handle: 'remap:linear:500x2:...', method: 'linear', ... }]
   */
  list(): Promise<KeptMap[]> {
    return this.serial(async () => {
      const { maps } = await this.readIndex();
      return [...maps.values()].sort((a, b) => (a.saved < b.saved ? 1 : a.saved > b.saved ? -1 : 0));
    });
  }

  /**
   * The JSON text kept under `handle`, or null when this workbook keeps no such map.
   * @throws RemapError when the kept copy is incomplete or damaged (it says to fit again).
   */
  load(handle: string): Promise<string | null> {
    return this.serial(async () => {
      const { maps } = await this.readIndex();
      const entry = maps.get(handle);
      if (!entry) return null;
      const pieces: string[] = [];
      for (let i = 0; i < entry.parts.length; i++) {
        const xml = await this.run(async (context) => {
          const part = context.workbook.customXmlParts.getItemOrNullObject(entry.parts[i]);
          await context.sync();
          if (part.isNullObject) return null;
          const x = part.getXml();
          await context.sync();
          // A ClientResult is filled by the sync above; it has no load() (the rule expects one for every proxy).
          // eslint-disable-next-line office-addins/load-object-before-read
          return x.value;
        });
        const chunk = xml === null ? undefined : xmlElements(xml, 'chunk')[0];
        if (!chunk || chunk.attrs.handle !== handle || Number(chunk.attrs.index) !== i)
          throw damaged(handle, `part ${i + 1} of ${entry.parts.length} is missing`);
        pieces.push(unescapeXmlText(chunk.inner));
      }
      const json = pieces.join('');
      if (json.length !== entry.chars || fingerprint(json) !== entry.check)
        throw damaged(handle, 'its text does not match the recorded length and fingerprint');
      return json;
    });
  }

  /**
   * Keeps `json` under `handle`, replacing an earlier copy. Saving the same
   * text again only updates the recorded cell. The JSON is checked with
   * parseMapJSON (parseGroupedMapJSON for a map by group) first, so only maps
   * this product can read are kept.
   * @throws RemapError for JSON that is not a map; Office errors when the workbook refuses the write.
   */
  save(handle: string, text: string, info: KeptInfo = {}): Promise<void> {
    return this.serial(async () => {
      const map = summaryOf(text);
      const json = jsonSafeForXml(text);
      const { maps, indexIds } = await this.readIndex();
      const old = maps.get(handle);
      const check = fingerprint(json);
      if (old && old.check === check && old.chars === json.length) {
        if (info.cell && info.cell !== old.cell) {
          maps.set(handle, { ...old, cell: info.cell });
          await this.writeIndex(maps, indexIds);
        }
        return;
      }
      const pieces: string[] = [];
      for (let at = 0; at < json.length; at += this.chunkChars) pieces.push(json.slice(at, at + this.chunkChars));
      if (pieces.length === 0) pieces.push('');
      const ids: string[] = [];
      for (let i = 0; i < pieces.length; i++) {
        const xml = `<chunk xmlns="${CHUNK_NAMESPACE}" handle="${escapeXml(handle)}" index="${i}" of="${pieces.length}">${escapeXml(pieces[i])}</chunk>`;
        ids.push(
          await this.run(async (context) => {
            const part = context.workbook.customXmlParts.add(xml);
            part.load('id');
            await context.sync();
            return part.id;
          }),
        );
      }
      maps.set(handle, {
        handle,
        ...map,
        saved: this.now().toISOString(),
        chars: json.length,
        check,
        cell: info.cell ?? old?.cell ?? '',
        parts: ids,
      });
      await this.writeIndex(maps, indexIds);
      await this.removeStrayChunks(maps);
    });
  }

  /**
   * Removes the map kept under `handle`; true when there was one.
   * @example await store.remove('remap:linear:500x2:0f3a2c1b9d4e77') // true
   */
  remove(handle: string): Promise<boolean> {
    return this.serial(async () => {
      const { maps, indexIds } = await this.readIndex();
      if (!maps.delete(handle)) return false;
      await this.writeIndex(maps, indexIds);
      await this.removeStrayChunks(maps);
      return true;
    });
  }

  /** Reads every index part (normally one; two runtimes racing may leave two, which are merged). */
  private async readIndex(): Promise<{ maps: Map<string, KeptMap>; indexIds: string[] }> {
    return this.run(async (context) => {
      const parts = context.workbook.customXmlParts.getByNamespace(INDEX_NAMESPACE);
      parts.load('items/id');
      await context.sync();
      const xmls = parts.items.map((p) => p.getXml());
      await context.sync();
      const maps = new Map<string, KeptMap>();
      for (const x of xmls) {
        for (const el of xmlElements(x.value, 'map')) {
          const e = entryOf(
            el.attrs,
            xmlElements(el.inner, 'part').map((p) => p.attrs.id ?? ''),
          );
          const have = maps.get(e.handle);
          if (!have || have.saved < e.saved) maps.set(e.handle, e);
        }
      }
      return { maps, indexIds: parts.items.map((p) => p.id) };
    });
  }

  private async writeIndex(maps: Map<string, KeptMap>, indexIds: readonly string[]): Promise<void> {
    const body = [...maps.values()]
      .map((m) => {
        const a = (k: string, v: string | number) => ` ${k}="${escapeXml(String(v))}"`;
        const attrs =
          a('handle', m.handle) +
          a('method', m.method) +
          a('rows', m.rows) +
          a('target-rows', m.targetRows) +
          a('cols', m.cols) +
          a('cost', m.cost) +
          a('saved', m.saved) +
          a('chars', m.chars) +
          a('check', m.check) +
          a('cell', m.cell) +
          (m.grouped ? a('grouped', 1) : '');
        return `<map${attrs}>${m.parts.map((id) => `<part id="${escapeXml(id)}"/>`).join('')}</map>`;
      })
      .join('');
    const xml = `<maps xmlns="${INDEX_NAMESPACE}">${body}</maps>`;
    await this.run(async (context) => {
      if (indexIds.length === 0) context.workbook.customXmlParts.add(xml);
      else {
        context.workbook.customXmlParts.getItem(indexIds[0]).setXml(xml);
        for (const id of indexIds.slice(1)) context.workbook.customXmlParts.getItem(id).delete();
      }
      await context.sync();
    });
  }

  /** Deletes chunk parts no kept map refers to (left by a replaced map or an interrupted save). */
  private async removeStrayChunks(maps: Map<string, KeptMap>): Promise<void> {
    const used = new Set<string>();
    for (const m of maps.values()) for (const id of m.parts) used.add(id);
    await this.run(async (context) => {
      const parts = context.workbook.customXmlParts.getByNamespace(CHUNK_NAMESPACE);
      parts.load('items/id');
      await context.sync();
      let any = false;
      // items was loaded with its ids just above ('items/id'); the rule recognises only load('items').
      // eslint-disable-next-line office-addins/load-object-before-read
      for (const p of parts.items) {
        if (!used.has(p.id)) {
          p.delete();
          any = true;
        }
      }
      if (any) await context.sync();
    });
  }
}

function entryOf(a: Readonly<Record<string, string>>, parts: string[]): KeptMap {
  const num = (k: string) => (Number.isFinite(Number(a[k])) ? Number(a[k]) : NaN);
  return {
    handle: a.handle ?? '',
    method: a.method ?? '',
    rows: num('rows'),
    targetRows: num('target-rows'),
    cols: num('cols'),
    cost: num('cost'),
    saved: a.saved ?? '',
    chars: num('chars'),
    check: a.check ?? '',
    cell: a.cell ?? '',
    grouped: a.grouped === '1',
    parts,
  };
}

/** What the index records of a map's JSON text, after checking it as the engine reads it. O(length). */
function summaryOf(text: string): Pick<KeptMap, 'method' | 'rows' | 'targetRows' | 'cols' | 'cost' | 'grouped'> {
  let grouped = false;
  try {
    grouped = isGroupedMapJSON(JSON.parse(text));
  } catch {
    grouped = false; // parseMapJSON below says what is wrong with the text
  }
  if (!grouped) {
    const map = parseMapJSON(text);
    return { method: map.method, rows: map.n.source, targetRows: map.n.target, cols: map.d, cost: map.fitted.cost.w2Squared, grouped: false };
  }
  const g = parseGroupedMapJSON(text);
  let rows = 0;
  let targetRows = 0;
  let num = 0;
  let den = 0;
  for (const e of g.groups) {
    rows += e.rows.source;
    targetRows += e.rows.target;
    const cost = (e.map ?? g.pooled)?.fitted.cost.w2Squared ?? 0;
    num += e.weight.source * cost;
    den += e.weight.source;
  }
  // The same source-weighted mean GroupedMap.report() gives as the cost of all groups.
  return { method: g.method, rows, targetRows, cols: g.d, cost: den > 0 ? num / den : 0, grouped: true };
}

/** The fingerprint recorded beside a kept map's text. O(length). */
export function fingerprint(text: string): string {
  return new Fingerprint().text(text).hex();
}

function damaged(handle: string, why: string): RemapError {
  return new RemapError(
    `The copy of map ${handle} kept in this workbook is damaged (${why}); recalculate the REMAP.FIT cell that made it to fit and keep it again.`,
  );
}

/*
 * A small stand-in for Office.js in Excel, for the tests: Office.onReady, Excel.run over a fake workbook
 * (sheets of cells with values and formulas, the selection, used ranges, charts, custom XML parts), and
 * CustomFunctions (associate, Error, StreamingInvocation-like calls). Loads and writes take effect at
 * ctx.sync(), like the real batching, and reading a property that was not loaded throws, so code that
 * forgets load() fails here too. A request whose payload passes `payloadLimit` (5 MB by default, the
 * documented Office.js limit on Excel on the web) throws, so large transfers must be split.
 *
 * Formulas written into cells that call REMAP.* functions are calculated by the associated custom functions
 * (simple arguments only: ranges, text, numbers, blanks), streaming results recorded in `streamLog`.
 *
 * Plain JavaScript, used by jest (require) and injected into the browser page before its scripts.
 */
(function (root) {
  'use strict';

  function colName(c) {
    let s = '';
    for (c += 1; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
    return s;
  }
  function colIndex(letters) {
    let c = 0;
    for (const ch of letters.toUpperCase()) c = c * 26 + (ch.charCodeAt(0) - 64);
    return c - 1;
  }
  function quoteSheet(name) {
    return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) ? name : "'" + name.replace(/'/g, "''") + "'";
  }
  function splitAddress(address) {
    const bang = address.lastIndexOf('!');
    if (bang < 0) return { sheet: null, cells: address };
    let sheet = address.slice(0, bang);
    if (sheet.startsWith("'")) sheet = sheet.slice(1, -1).replace(/''/g, "'");
    return { sheet, cells: address.slice(bang + 1) };
  }
  const MAX_ROWS = 1048576;
  function parseCells(a1) {
    const parts = a1.replace(/\$/g, '').toUpperCase().split(':');
    const one = (p) => {
      const m = /^([A-Z]*)(\d*)$/.exec(p);
      if (!m) throw new Error('InvalidArgument: bad address ' + a1);
      return { c: m[1] ? colIndex(m[1]) : null, r: m[2] ? Number(m[2]) - 1 : null };
    };
    const a = one(parts[0]);
    const b = one(parts[1] || parts[0]);
    return {
      r0: a.r === null ? 0 : a.r,
      c0: a.c === null ? 0 : a.c,
      r1: b.r === null ? MAX_ROWS - 1 : b.r,
      c1: b.c === null ? 16383 : b.c,
    };
  }
  function payloadOf(v) {
    return typeof v === 'string' ? v.length : JSON.stringify(v === undefined ? null : v).length;
  }

  /** The workbook's state: plain data, so a test can copy it to "reopen" the file. */
  function emptyState() {
    return {
      sheets: [{ name: 'Sheet1', cells: {}, charts: [] }],
      active: 'Sheet1',
      selection: { sheet: 'Sheet1', r0: 0, c0: 0, r1: 0, c1: 0 },
      parts: [],
      nextId: 1,
    };
  }

  function createWorkbook(options) {
    options = options || {};
    const state = options.state ? JSON.parse(JSON.stringify(options.state)) : emptyState();
    const mock = {
      state,
      payloadLimit: options.payloadLimit || 5 * 1024 * 1024,
      syncs: 0,
      streamLog: [],
      functions: {},
      errors: [],
    };

    function sheetNamed(name) {
      const s = state.sheets.find((x) => x.name.toLowerCase() === String(name).toLowerCase());
      if (!s) throw new Error('ItemNotFound: no worksheet named ' + name);
      return s;
    }
    function cell(sheet, r, c) {
      return sheet.cells[r + ',' + c];
    }
    function valueOf(sheet, r, c) {
      const x = cell(sheet, r, c);
      if (!x) return '';
      return x.error ? x.error : x.value === undefined || x.value === null ? '' : x.value;
    }
    function typeOf(sheet, r, c) {
      const x = cell(sheet, r, c);
      if (!x) return 'Empty';
      if (x.error) return 'Error';
      const v = x.value;
      if (v === '' || v === null || v === undefined) return 'Empty';
      return typeof v === 'number' ? 'Double' : typeof v === 'boolean' ? 'Boolean' : 'String';
    }
    function setCell(sheet, r, c, content) {
      const key = r + ',' + c;
      if (content === '' || content === null || content === undefined) delete sheet.cells[key];
      else sheet.cells[key] = content;
    }
    function usedBox(sheet) {
      let box = null;
      for (const key of Object.keys(sheet.cells)) {
        const [r, c] = key.split(',').map(Number);
        const x = sheet.cells[key];
        if (!x.error && (x.value === '' || x.value === undefined || x.value === null) && !x.formula) continue;
        if (!box) box = { r0: r, c0: c, r1: r, c1: c };
        else box = { r0: Math.min(box.r0, r), c0: Math.min(box.c0, c), r1: Math.max(box.r1, r), c1: Math.max(box.c1, c) };
      }
      return box;
    }
    function addressOf(sheet, box) {
      const a = colName(box.c0) + (box.r0 + 1);
      const b = colName(box.c1) + (box.r1 + 1);
      return quoteSheet(sheet.name) + '!' + (a === b ? a : a + ':' + b);
    }

    /* ---------- formulas: REMAP.* calls computed by the associated functions ---------- */
    function splitArgs(text) {
      const args = [];
      let cur = '';
      let inStr = false;
      let depth = 0;
      for (let i = 0; i < text.length; i++) {
        const ch = text[i];
        if (inStr) {
          cur += ch;
          if (ch === '"') {
            if (text[i + 1] === '"') cur += text[++i];
            else inStr = false;
          }
        } else if (ch === '"') {
          inStr = true;
          cur += ch;
        } else if (ch === '(' || ch === '{') {
          depth++;
          cur += ch;
        } else if (ch === ')' || ch === '}') {
          depth--;
          cur += ch;
        } else if (ch === ',' && depth === 0) {
          args.push(cur.trim());
          cur = '';
        } else cur += ch;
      }
      args.push(cur.trim());
      return args;
    }
    function argValue(sheet, text) {
      if (text === '') return null;
      if (text.startsWith('"')) return text.slice(1, -1).replace(/""/g, '"');
      if (/^-?\d+(\.\d+)?([eE][-+]?\d+)?$/.test(text)) return Number(text);
      const { sheet: sn, cells } = splitAddress(text);
      const s = sn === null ? sheet : sheetNamed(sn);
      const b = parseCells(cells);
      const used = usedBox(s);
      const r1 = Math.min(b.r1, used ? Math.max(used.r1, b.r0) : b.r0);
      const rows = [];
      for (let r = b.r0; r <= r1; r++) {
        const row = [];
        for (let c = b.c0; c <= b.c1 && c <= b.c0 + 200; c++) {
          const x = cell(s, r, c);
          row.push(!x ? '' : x.error ? { code: x.error, message: x.error } : x.value);
        }
        rows.push(row);
      }
      return rows;
    }
    function recalc(sheet, r, c) {
      const x = cell(sheet, r, c);
      if (!x || !x.formula) return;
      const m = /^=REMAP\.([A-Z]+)\(([\s\S]*)\)$/i.exec(x.formula);
      if (!m) return;
      const id = m[1].toUpperCase();
      const fn = mock.functions[id];
      if (!fn) {
        x.error = '#NAME?';
        return;
      }
      const args = splitArgs(m[2]).map((a) => argValue(sheet, a));
      const address = addressOf(sheet, { r0: r, c0: c, r1: r, c1: c });
      const token = {};
      x.token = token;
      delete x.error;
      x.value = '#BUSY!';
      const put = (v) => {
        if (x.token !== token) return;
        if (v && typeof v === 'object' && !Array.isArray(v) && 'code' in v) {
          x.error = v.code;
          x.message = v.message;
          x.value = undefined;
        } else {
          delete x.error;
          x.value = Array.isArray(v) ? v[0][0] : v;
          if (Array.isArray(v)) x.spill = v;
        }
      };
      const meta = mock.meta && mock.meta[id];
      try {
        if (meta && meta.options && meta.options.stream) {
          const inv = {
            address,
            setResult: (v) => {
              mock.streamLog.push({ address, value: v && typeof v === 'object' && 'code' in v ? v.code + ' ' + v.message : v, at: Date.now() });
              put(v);
            },
            onCanceled: null,
          };
          x.cancel = () => inv.onCanceled && inv.onCanceled();
          while (args.length < meta.parameters.length) args.push(null);
          fn.apply(null, args.concat([inv]));
        } else if (meta && meta.options && (meta.options.cancelable || meta.options.requiresAddress)) {
          // A CancelableInvocation: the cell's address, and onCanceled, called when the formula is replaced.
          const inv = { address, onCanceled: null };
          x.cancel = () => inv.onCanceled && inv.onCanceled();
          while (args.length < meta.parameters.length) args.push(null);
          const v = fn.apply(null, args.concat([inv]));
          if (v && typeof v.then === 'function') v.then(put, (e) => put(e));
          else put(v);
        } else {
          const v = fn.apply(null, args);
          if (v && typeof v.then === 'function') v.then(put, (e) => put(e));
          else put(v);
        }
      } catch (e) {
        put(e && e.code ? e : { code: '#VALUE!', message: String(e && e.message) });
      }
    }
    mock.recalc = recalc;
    mock.cellAt = (address) => {
      const { sheet, cells } = splitAddress(address);
      const b = parseCells(cells);
      return cell(sheetNamed(sheet || state.active), b.r0, b.c0);
    };
    mock.setValues = (address, rows) => {
      const { sheet, cells } = splitAddress(address);
      const s = sheetNamed(sheet || state.active);
      const b = parseCells(cells);
      rows.forEach((row, i) =>
        row.forEach((v, j) => setCell(s, b.r0 + i, b.c0 + j, v && typeof v === 'object' && v.error ? { error: v.error } : { value: v })),
      );
    };
    mock.select = (address) => {
      const { sheet, cells } = splitAddress(address);
      const s = sheetNamed(sheet || state.active);
      state.active = s.name;
      state.selection = Object.assign({ sheet: s.name }, parseCells(cells));
    };

    /* ---------- the request context ---------- */
    function makeContext() {
      const ops = [];
      const loads = [];
      const ctx = { workbook: null, sync: null };

      const nullables = [];
      function proxy(resolveLive, kind) {
        const obj = { _loaded: {}, _kind: kind };
        obj.load = (props) => {
          const list = typeof props === 'string' ? props.split(',') : Array.isArray(props) ? props : Object.keys(props || {});
          loads.push({ obj, props: list.map((p) => p.trim()), resolveLive });
          return obj;
        };
        return obj;
      }
      function loadedGetter(obj, name) {
        Object.defineProperty(obj, name, {
          get() {
            if (!(name in obj._loaded)) throw new Error('PropertyNotLoaded: ' + obj._kind + '.' + name + ' was read before load() and sync()');
            return obj._loaded[name];
          },
          set(v) {
            obj._setters[name](v);
          },
          configurable: true,
        });
      }

      function rangeProxy(getBox) {
        // getBox() -> { sheet, r0, c0, r1, c1 } or null (null object)
        const obj = proxy(getBox, 'Range');
        obj._setters = {
          values: (v) =>
            ops.push(() => {
              const b = getBox();
              v.forEach((row, i) => row.forEach((val, j) => setCell(b.sheet, b.r0 + i, b.c0 + j, { value: val })));
            }),
          formulas: (v) =>
            ops.push(() => {
              const b = getBox();
              v.forEach((row, i) =>
                row.forEach((f, j) => {
                  const old = cell(b.sheet, b.r0 + i, b.c0 + j);
                  if (old && old.cancel) old.cancel();
                  if (typeof f === 'string' && f.startsWith('=')) {
                    setCell(b.sheet, b.r0 + i, b.c0 + j, { formula: f, value: 0 });
                    recalc(b.sheet, b.r0 + i, b.c0 + j);
                  } else setCell(b.sheet, b.r0 + i, b.c0 + j, { value: f });
                }),
              );
            }),
        };
        ['address', 'values', 'valueTypes', 'formulas', 'rowIndex', 'columnIndex', 'rowCount', 'columnCount', 'isNullObject'].forEach((n) =>
          loadedGetter(obj, n),
        );
        obj._loaded.isNullObject = false;
        obj._compute = (name) => {
          const b = getBox();
          if (!b) return name === 'isNullObject' ? true : null;
          const rows = [];
          if (name === 'isNullObject') return false;
          if (name === 'address') return addressOf(b.sheet, b);
          if (name === 'rowIndex') return b.r0;
          if (name === 'columnIndex') return b.c0;
          if (name === 'rowCount') return b.r1 - b.r0 + 1;
          if (name === 'columnCount') return b.c1 - b.c0 + 1;
          if (name === 'isNullObject') return false;
          if ((b.r1 - b.r0 + 1) * (b.c1 - b.c0 + 1) > 5e6) throw new Error('ResponsePayloadSizeLimitExceeded: range too large');
          for (let r = b.r0; r <= b.r1; r++) {
            const row = [];
            for (let c = b.c0; c <= b.c1; c++) {
              if (name === 'values') row.push(valueOf(b.sheet, r, c));
              else if (name === 'valueTypes') row.push(typeOf(b.sheet, r, c));
              else if (name === 'formulas') {
                const x = cell(b.sheet, r, c);
                row.push(x && x.formula ? x.formula : valueOf(b.sheet, r, c));
              }
            }
            rows.push(row);
          }
          return rows;
        };
        obj.getCell = (i, j) =>
          rangeProxy(() => {
            const b = getBox();
            return { sheet: b.sheet, r0: b.r0 + i, c0: b.c0 + j, r1: b.r0 + i, c1: b.c0 + j };
          });
        obj.select = () =>
          ops.push(() => {
            const b = getBox();
            state.active = b.sheet.name;
            state.selection = { sheet: b.sheet.name, r0: b.r0, c0: b.c0, r1: b.r1, c1: b.c1 };
          });
        obj.worksheet = sheetProxy(() => getBox().sheet);
        return obj;
      }

      function sheetProxy(getSheet) {
        const obj = proxy(getSheet, 'Worksheet');
        obj._setters = {};
        loadedGetter(obj, 'name');
        obj._compute = (name) => (name === 'name' ? getSheet().name : null);
        obj.getRange = (a1) => rangeProxy(() => Object.assign({ sheet: getSheet() }, parseCells(a1 || 'A1')));
        obj.getRangeByIndexes = (r, c, nr, nc) => rangeProxy(() => ({ sheet: getSheet(), r0: r, c0: c, r1: r + nr - 1, c1: c + nc - 1 }));
        obj.getUsedRangeOrNullObject = () => {
          const r = rangeProxy(() => {
            const box = usedBox(getSheet());
            return box ? Object.assign({ sheet: getSheet() }, box) : null;
          });
          delete r._loaded.isNullObject;
          nullables.push(r);
          return r;
        };
        obj.activate = () =>
          ops.push(() => {
            state.active = getSheet().name;
          });
        obj.charts = {
          add(type, range, seriesBy) {
            const chart = { type, seriesBy, title: { text: '' }, position: null };
            const handle = {
              title: {},
              setPosition(a, b) {
                ops.push(() => {
                  chart.position = [a._compute('address'), b._compute('address')];
                });
              },
            };
            Object.defineProperty(handle.title, 'text', {
              set(v) {
                ops.push(() => {
                  chart.title.text = v;
                });
              },
              get() {
                return chart.title.text;
              },
            });
            ops.push(() => {
              chart.source = range._compute('address');
              getSheet().charts.push(chart);
            });
            return handle;
          },
        };
        return obj;
      }

      function partProxy(getPart) {
        const obj = proxy(getPart, 'CustomXmlPart');
        obj._setters = {};
        loadedGetter(obj, 'id');
        loadedGetter(obj, 'isNullObject');
        obj._compute = (name) => {
          const p = getPart();
          if (name === 'isNullObject') return !p;
          if (!p) throw new Error('ItemNotFound: custom XML part');
          return name === 'id' ? p.id : name === 'namespaceUri' ? p.ns : null;
        };
        obj.getXml = () => {
          const result = { _v: undefined, _set: false };
          Object.defineProperty(result, 'value', {
            get() {
              if (!result._set) throw new Error('PropertyNotLoaded: getXml() value read before sync()');
              return result._v;
            },
          });
          loads.push({
            result,
            compute: () => {
              const p = getPart();
              if (!p) throw new Error('ItemNotFound: custom XML part');
              return p.xml;
            },
          });
          return result;
        };
        obj.setXml = (xml) =>
          ops.push(() => {
            const p = getPart();
            if (!p) throw new Error('ItemNotFound: custom XML part');
            p.xml = xml;
            p.ns = nsOf(xml);
          });
        obj.delete = () =>
          ops.push(() => {
            const p = getPart();
            if (!p) throw new Error('ItemNotFound: custom XML part');
            state.parts = state.parts.filter((q) => q !== p);
          });
        return obj;
      }
      function nsOf(xml) {
        const m = /^\s*(?:<\?xml[^>]*\?>\s*)?<[\w.:-]+[^>]*?\sxmlns="([^"]*)"/.exec(xml);
        return m ? m[1] : '';
      }

      const sheets = {
        _loaded: {},
        getItem: (name) => sheetProxy(() => sheetNamed(name)),
        getActiveWorksheet: () => sheetProxy(() => sheetNamed(state.active)),
        add: (name) => {
          const made = { name, cells: {}, charts: [] };
          ops.push(() => {
            if (state.sheets.some((s) => s.name.toLowerCase() === name.toLowerCase())) throw new Error('ItemAlreadyExists: ' + name);
            state.sheets.push(made);
          });
          return sheetProxy(() => made);
        },
        load: () => {
          loads.push({
            compute: () => state.sheets.map((s) => ({ name: s.name })),
            assign: (v) => {
              sheets._items = v;
            },
          });
          return sheets;
        },
      };
      Object.defineProperty(sheets, 'items', {
        get() {
          if (!sheets._items) throw new Error('PropertyNotLoaded: worksheets.items');
          return sheets._items;
        },
      });

      const parts = {
        add(xml) {
          const part = { id: null, ns: nsOf(xml), xml };
          ops.push(() => {
            if (xml.length > mock.payloadLimit) throw new Error('RequestPayloadSizeLimitExceeded: ' + xml.length + ' characters in one request');
            part.id = '{' + String(state.nextId++).padStart(8, '0') + '-0000-4000-8000-000000000000}';
            state.parts.push(part);
          });
          return partProxy(() => part);
        },
        getItem: (id) => partProxy(() => state.parts.find((p) => p.id === id) || null),
        getItemOrNullObject: (id) => {
          const px = partProxy(() => state.parts.find((p) => p.id === id) || null);
          nullables.push(px);
          return px;
        },
        getByNamespace(ns) {
          const coll = {
            load() {
              loads.push({
                compute: () => state.parts.filter((p) => p.ns === ns),
                assign: (list) => {
                  coll._items = list.map((p) => {
                    const px = partProxy(() => (state.parts.includes(p) ? p : null));
                    px._loaded.id = p.id;
                    return px;
                  });
                },
              });
              return coll;
            },
          };
          Object.defineProperty(coll, 'items', {
            get() {
              if (!coll._items) throw new Error('PropertyNotLoaded: customXmlParts items');
              return coll._items;
            },
          });
          return coll;
        },
      };

      ctx.workbook = {
        worksheets: sheets,
        customXmlParts: parts,
        getSelectedRange: () =>
          rangeProxy(() => {
            const s = state.selection;
            return { sheet: sheetNamed(s.sheet), r0: s.r0, c0: s.c0, r1: s.r1, c1: s.c1 };
          }),
      };
      ctx.sync = async () => {
        mock.syncs++;
        await Promise.resolve();
        let size = 0;
        const todo = ops.splice(0);
        for (const op of todo) op();
        for (const l of loads.splice(0)) {
          if (l.result) {
            l.result._v = l.compute();
            l.result._set = true;
            size += payloadOf(l.result._v);
          } else if (l.assign) {
            const v = l.compute();
            l.assign(v);
            size += payloadOf(v.map ? v.map((x) => x.name || x.id || '') : v);
          } else {
            for (const p of l.props) {
              const v = l.obj._compute(p);
              l.obj._loaded[p] = v;
              size += payloadOf(v);
            }
          }
        }
        // Like Office.js, isNullObject of an ...OrNullObject result is known after any sync, loaded or not.
        for (const n of nullables.splice(0)) n._loaded.isNullObject = n._compute('isNullObject');
        if (size > mock.payloadLimit) throw new Error('ResponsePayloadSizeLimitExceeded: ' + size + ' characters in one response');
      };
      return ctx;
    }

    mock.run = async (batch) => {
      const ctx = makeContext();
      return batch(ctx);
    };
    return mock;
  }

  /** Installs Office, Excel and CustomFunctions globals on `target` over one fake workbook; returns the mock. */
  function install(target, options) {
    const mock = createWorkbook(options);
    class SheetError extends Error {
      constructor(code, message) {
        super(message || code);
        this.code = code;
      }
    }
    target.CustomFunctions = {
      associate(id, fn) {
        mock.functions[String(id).toUpperCase()] = fn;
      },
      Error: SheetError,
      ErrorCode: {
        invalidValue: '#VALUE!',
        invalidNumber: '#NUM!',
        notAvailable: '#N/A',
        divisionByZero: '#DIV/0!',
        nullReference: '#NULL!',
        invalidName: '#NAME?',
        invalidReference: '#REF!',
      },
    };
    target.Excel = { run: mock.run };
    target.Office = {
      HostType: { Excel: 'Excel' },
      onReady(cb) {
        const info = { host: 'Excel', platform: 'OfficeOnline' };
        return Promise.resolve().then(() => {
          if (cb) cb(info);
          return info;
        });
      },
    };
    target.__officeMock = mock;
    return mock;
  }

  const api = { createWorkbook, install, emptyState, colName, parseCells };
  if (typeof module !== 'undefined' && module.exports) module.exports = api;
  else install(root, root.__officeMockOptions || {});
})(typeof globalThis !== 'undefined' ? globalThis : this);

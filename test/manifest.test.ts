/**
 * Offline checks of manifest.xml against the build that serves it (webpack.config.js) and the files in assets/.
 * Office's online validation service is not reachable from here, so this test parses the manifest the way
 * office-addin-manifest's readManifestFile does (xml2js with default options, the parser that package depends on)
 * and checks what Office needs to load a shared-runtime add-in.
 * No build runs: the emitted file names come from the webpack configuration itself.
 */
import { REQUIRED_SETS } from '../src/workbook/requirements';
import fs from 'fs';
import path from 'path';
import zlib from 'zlib';

const ROOT = path.resolve(__dirname, '..');
const MANIFEST = path.join(ROOT, 'manifest.xml');
const ASSETS = path.join(ROOT, 'assets');

type Xml = any; // xml2js output: elements are arrays, attributes live under "$"
// office-addin-manifest's own entry points also load uuid and the JSON-manifest tooling, which ship ES modules
// that jest does not transform; so take its parser, resolved from its folder, and read the tree directly.
const xml2js: { parseStringPromise(xml: string): Promise<Xml> } = require(
  require.resolve('xml2js', { paths: [path.dirname(require.resolve('office-addin-manifest/package.json'))] }),
);
type WebpackConfigFactory = ((env: Record<string, unknown>, argv: Record<string, unknown>) => Promise<any>) & { DEV_BASE_URL: string };

const makeConfig: WebpackConfigFactory = require('../webpack.config.js');

const icons: { SIZES: number[]; render(size: number): Buffer } = require('../scripts/make-icons.js');

let app: Xml; // <OfficeApp>
let host: Xml; // <VersionOverrides><Hosts><Host xsi:type="Workbook">
let urls: Map<string, string>; // bt:Url id -> URL
let images: Map<string, string>; // bt:Image id -> URL
let shortStrings: Map<string, string>;
let config: any; // the production webpack configuration

function resourceMap(resources: Xml, group: string, item: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const el of resources[group]?.[0]?.[item] ?? []) out.set(el.$.id, el.$.DefaultValue);
  return out;
}

/** Every resid attribute anywhere under `node`. */
function allResids(node: Xml, out: string[] = []): string[] {
  if (Array.isArray(node)) node.forEach((n) => allResids(n, out));
  else if (node && typeof node === 'object') {
    for (const [key, value] of Object.entries(node)) {
      if (key === '$') {
        const resid = (value as Record<string, string>).resid;
        if (resid) out.push(resid);
      } else allResids(value, out);
    }
  }
  return out;
}

/** Every absolute URL written as a DefaultValue or AppDomain anywhere in the manifest. */
function allUrls(node: Xml, out: string[] = []): string[] {
  if (typeof node === 'string') {
    if (/^https?:\/\//.test(node)) out.push(node);
  } else if (Array.isArray(node)) node.forEach((n) => allUrls(n, out));
  else if (node && typeof node === 'object') {
    for (const [key, value] of Object.entries(node)) {
      if (key === '$') {
        for (const v of Object.values(value as Record<string, string>)) {
          if (/^https?:\/\//.test(v) && !v.startsWith('http://schemas.') && !v.startsWith('http://www.w3.org/')) out.push(v);
        }
      } else allUrls(value, out);
    }
  }
  return out;
}

function pluginNamed(name: string): any {
  const plugin = config.plugins.find((p: any) => p.constructor.name === name);
  if (!plugin) throw new Error(`webpack.config.js has no ${name}`);
  return plugin;
}

/** The file names the build writes at the root of dist/ (scripts, metadata, page, copied files). */
function emittedNames(): Set<string> {
  const names = new Set<string>(Object.keys(config.entry).map((entry) => `${entry}.js`));
  names.add(pluginNamed('CustomFunctionsMetadataPlugin').options.output);
  names.add(pluginNamed('HtmlWebpackPlugin').userOptions.filename);
  for (const pattern of pluginNamed('CopyPlugin').patterns) {
    if (!String(pattern.to).includes('[name]')) names.add(pattern.to);
  }
  return names;
}

/** Reads width, height and straight RGBA pixels of a PNG this project wrote (8-bit RGBA, filter 0 rows). */
function readPng(file: string): { width: number; height: number; rgba: Buffer } {
  const buf = fs.readFileSync(file);
  // Source: PNG specification (W3C), chunk layout: length, type, data, CRC; IHDR first.
  expect(buf.subarray(12, 16).toString('ascii')).toBe('IHDR');
  const width = buf.readUInt32BE(16);
  const height = buf.readUInt32BE(20);
  const idat: Buffer[] = [];
  for (let off = 8; off < buf.length;) {
    const len = buf.readUInt32BE(off);
    const type = buf.subarray(off + 4, off + 8).toString('ascii');
    if (type === 'IDAT') idat.push(buf.subarray(off + 8, off + 8 + len));
    off += 12 + len;
  }
  const raw = zlib.inflateSync(Buffer.concat(idat));
  const stride = width * 4;
  const rgba = Buffer.alloc(stride * height);
  for (let y = 0; y < height; y++) {
    expect(raw[y * (stride + 1)]).toBe(0);
    raw.copy(rgba, y * stride, y * (stride + 1) + 1, (y + 1) * (stride + 1));
  }
  return { width, height, rgba };
}

beforeAll(async () => {
  const xml = await xml2js.parseStringPromise(fs.readFileSync(MANIFEST, 'utf8'));
  app = xml.OfficeApp;
  const overrides = app.VersionOverrides[0];
  host = overrides.Hosts[0].Host[0];
  const resources = overrides.Resources[0];
  urls = resourceMap(resources, 'bt:Urls', 'bt:Url');
  images = resourceMap(resources, 'bt:Images', 'bt:Image');
  shortStrings = resourceMap(resources, 'bt:ShortStrings', 'bt:String');
  config = await makeConfig({ WEBPACK_BUILD: true }, { mode: 'production' });
});

describe('manifest.xml identity', () => {
  test('the add-in id is a GUID and the names are Remap', () => {
    // Source: Office add-in manifest schema (common practice): <Id> is a GUID (ST_UUID), 8-4-4-4-12 hex digits.
    expect(app.Id[0]).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[1-5][0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/i);
    expect(app.DisplayName[0].$.DefaultValue).toBe('Remap');
    expect(app.ProviderName[0]).toBe('Remap');
    expect(app.$['xsi:type']).toBe('TaskPaneApp');
    expect(app.Hosts[0].Host.map((h: Xml) => h.$.Name)).toEqual(['Workbook']);
    // ReadWriteDocument: the add-in stores fitted maps in the workbook; ReadDocument could not.
    expect(app.Permissions[0]).toBe('ReadWriteDocument');
    // Source: Office add-in manifest schema (common practice): <Version> is n.n.n.n, each part a number.
    expect(app.Version[0]).toMatch(/^\d+(\.\d+){0,3}$/);
  });

  test('the worksheet functions live in the REMAP namespace', () => {
    const point = host.AllFormFactors[0].ExtensionPoint.find((e: Xml) => e.$['xsi:type'] === 'CustomFunctions');
    expect(point).toBeDefined();
    expect(shortStrings.get(point.Namespace[0].$.resid)).toBe('REMAP');
  });

  test('the requirement sets ask for the Excel API the code uses, custom functions and the shared runtime, as the pane checks them', () => {
    // Source: Office add-in manifest schema (common practice): <Requirements><Sets><Set Name MinVersion/>;
    // Excel JavaScript API requirement sets: customXmlParts is ExcelApi 1.5, Worksheet.getRangeByIndexes 1.7.
    const sets = (app.Requirements?.[0]?.Sets?.[0]?.Set ?? []).map((s: Xml) => `${s.$.Name} ${s.$.MinVersion}`);
    expect(sets).toEqual(expect.arrayContaining(['ExcelApi 1.7', 'CustomFunctionsRuntime 1.1', 'SharedRuntime 1.1']));
    expect([...REQUIRED_SETS].map((r) => `${r.name} ${r.version}`).sort()).toEqual([...sets].sort());
  });

  test('the fit worker loads lazily split code with importScripts, as a worker must', () => {
    // Source: webpack 5 documentation, entry descriptor chunkLoading ('jsonp' adds <script> tags, which a worker has no document for)
    expect(config.entry['fit-worker']).toMatchObject({ import: './src/fits/worker/fit-worker.ts', chunkLoading: 'import-scripts' });
  });

  test('support and learn-more links open the help page the build serves, not the pane', () => {
    // Source: design choice (a page of help, not the pane itself)
    const support = app.SupportUrl[0].$.DefaultValue;
    const learnMore = urls.get(host.DesktopFormFactor[0].GetStarted[0].LearnMoreUrl[0].$.resid);
    expect(support).toBe('https://localhost:3000/help.html');
    expect(learnMore).toBe(support);
    expect(emittedNames().has('help.html')).toBe(true);
  });
});

describe('manifest.xml URLs agree with the build', () => {
  test('every URL shares the one development base URL from webpack.config.js', () => {
    const all = allUrls(app);
    expect(all.length).toBeGreaterThan(10);
    const base = makeConfig.DEV_BASE_URL;
    expect(base).toMatch(/^https:\/\/localhost:\d+\/$/);
    for (const url of all) expect(url === base.replace(/\/$/, '') || url.startsWith(base)).toBe(true);
    expect(config.devServer).toBeUndefined(); // a production build config never asks for certificates
  });

  test('functions.json, functions.js and taskpane.html URLs name files the build emits', () => {
    const emitted = emittedNames();
    const point = host.AllFormFactors[0].ExtensionPoint.find((e: Xml) => e.$['xsi:type'] === 'CustomFunctions');
    const named = {
      script: urls.get(point.Script[0].SourceLocation[0].$.resid),
      metadata: urls.get(point.Metadata[0].SourceLocation[0].$.resid),
      page: urls.get(point.Page[0].SourceLocation[0].$.resid),
    };
    const base = makeConfig.DEV_BASE_URL;
    expect(named).toEqual({ script: `${base}functions.js`, metadata: `${base}functions.json`, page: `${base}taskpane.html` });
    for (const url of Object.values(named)) expect(emitted.has(String(url).slice(base.length))).toBe(true);
    expect(emitted.has('manifest.xml')).toBe(true);
    expect(app.DefaultSettings[0].SourceLocation[0].$.DefaultValue).toBe(named.page);
  });

  test('the page that hosts the functions loads the functions bundle too (shared runtime)', () => {
    const html = pluginNamed('HtmlWebpackPlugin').userOptions;
    expect(html.filename).toBe('taskpane.html');
    expect(html.chunks).toEqual(expect.arrayContaining(['functions', 'taskpane']));
  });

  test('REMAP_BASE_URL rewrites every manifest URL when the manifest is copied into dist/', async () => {
    const saved = process.env.REMAP_BASE_URL;
    process.env.REMAP_BASE_URL = 'https://addins.example.org/remap/';
    try {
      const prod = await makeConfig({ WEBPACK_BUILD: true }, { mode: 'production' });
      const copy = prod.plugins.find((p: any) => p.constructor.name === 'CopyPlugin');
      const pattern = copy.patterns.find((p: any) => p.from === 'manifest.xml');
      const out = String(await pattern.transform(fs.readFileSync(MANIFEST), MANIFEST));
      expect(out).not.toContain(makeConfig.DEV_BASE_URL);
      expect(out).toContain('<bt:Url id="Functions.Metadata.Url" DefaultValue="https://addins.example.org/remap/functions.json"/>');
    } finally {
      if (saved === undefined) delete process.env.REMAP_BASE_URL;
      else process.env.REMAP_BASE_URL = saved;
    }
  });
});

describe('the page the manifest opens', () => {
  test("taskpane.html's content security policy allows office.js and the add-in's own origin, and no eval", () => {
    const html = fs.readFileSync(path.join(ROOT, pluginNamed('HtmlWebpackPlugin').userOptions.template), 'utf8');
    const csp = /<meta\s+http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html)?.[1];
    expect(csp).toBeDefined();
    const directives = new Map<string, string[]>();
    for (const part of String(csp).split(';')) {
      const [name, ...sources] = part.trim().split(/\s+/);
      if (name) directives.set(name, sources);
    }
    // Source: common practice (CSP Level 3): office.js comes from Microsoft's CDN; wasm needs 'wasm-unsafe-eval' only.
    expect(directives.get('default-src')).toEqual(["'self'"]);
    expect(directives.get('script-src')).toEqual(["'self'", "'wasm-unsafe-eval'", 'https://appsforoffice.microsoft.com']);
    expect(directives.get('connect-src')).toEqual(["'self'"]);
    expect(directives.get('object-src')).toEqual(["'none'"]);
    expect(String(csp)).not.toContain("'unsafe-eval'");
    // The meta tag must come before any script for the policy to cover it.
    const officeJs = html.indexOf('<script type="text/javascript" src="https://appsforoffice.microsoft.com/lib/1/hosted/office.js">');
    expect(officeJs).toBeGreaterThan(html.indexOf('Content-Security-Policy'));
    expect(html).not.toMatch(/<script(?![^>]*\ssrc=)[^>]*>/); // no inline script
  });
});

describe('manifest.xml shared runtime wiring', () => {
  test('the runtime, the functions page, the function file and the ribbon action name the same page', () => {
    // Source: Office add-in manifest docs, "Configure your Office Add-in to use a shared runtime": the shared
    // runtime won't load if these resids differ.
    const runtime = host.Runtimes[0].Runtime[0].$;
    expect(runtime.lifetime).toBe('long');
    const point = host.AllFormFactors[0].ExtensionPoint.find((e: Xml) => e.$['xsi:type'] === 'CustomFunctions');
    const desktop = host.DesktopFormFactor[0];
    const ribbon = desktop.ExtensionPoint.find((e: Xml) => e.$['xsi:type'] === 'PrimaryCommandSurface');
    const tab = ribbon.OfficeTab[0];
    expect(tab.$.id).toBe('TabHome');
    const button = tab.Group[0].Control[0];
    const action = button.Action[0];
    expect(action.$['xsi:type']).toBe('ShowTaskpane');
    expect(action.TaskpaneId[0]).toMatch(/^\w+$/); // one named pane: a shared runtime supports only one
    const resids = {
      runtime: runtime.resid,
      functionsPage: point.Page[0].SourceLocation[0].$.resid,
      functionFile: desktop.FunctionFile[0].$.resid,
      ribbonAction: action.SourceLocation[0].$.resid,
    };
    expect(new Set(Object.values(resids)).size).toBe(1);
    expect(urls.get(resids.runtime)).toBe(`${makeConfig.DEV_BASE_URL}taskpane.html`);
  });

  test('every resid names a resource that exists', () => {
    const known = new Set<string>([...urls.keys(), ...images.keys(), ...shortStrings.keys()]);
    for (const s of app.VersionOverrides[0].Resources[0]['bt:LongStrings'][0]['bt:String']) known.add(s.$.id);
    const missing = allResids(app.VersionOverrides).filter((r) => !known.has(r));
    expect(missing).toEqual([]);
  });
});

describe('icons', () => {
  test('every icon URL names a PNG in assets/ of the size it claims', () => {
    const base = makeConfig.DEV_BASE_URL;
    const claimed: Array<[string, number]> = [
      // Source: Office add-in manifest schema (common practice): IconUrl 32 px, HighResolutionIconUrl 64 px.
      [app.IconUrl[0].$.DefaultValue, 32],
      [app.HighResolutionIconUrl[0].$.DefaultValue, 64],
    ];
    for (const [id, url] of images) claimed.push([url, Number(/(\d+)x\1$/.exec(id)?.[1])]);
    expect(claimed.length).toBe(5);
    for (const [url, size] of claimed) {
      expect(url.startsWith(`${base}assets/`)).toBe(true);
      const file = path.join(ASSETS, url.slice(`${base}assets/`.length));
      expect(fs.existsSync(file)).toBe(true);
      const png = readPng(file);
      expect([png.width, png.height]).toEqual([size, size]);
    }
    // Source: common practice: the build copies assets/*.png to dist/assets/ under the same names.
    const copy = pluginNamed('CopyPlugin').patterns.find((p: any) => p.from === 'assets/*.png');
    expect(copy.to).toBe('assets/[name][ext]');
  });

  test('assets/ holds exactly the pixels scripts/make-icons.js draws', () => {
    for (const size of icons.SIZES) {
      const png = readPng(path.join(ASSETS, `icon-${size}.png`));
      expect(png.rgba.equals(icons.render(size))).toBe(true);
    }
  });
});

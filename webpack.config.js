/**
 * Builds the Remap add-in into dist/:
 *   functions.js    the worksheet functions (src/functions/functions.ts) with CustomFunctions.associate calls
 *   functions.json  their metadata, generated from the JSDoc @customfunction tags (never edited by hand)
 *   taskpane.html   the one shared-runtime page: loads office.js, then functions.js and taskpane.js
 *   taskpane.js, taskpane.css, manifest.xml, assets/icon-*.png, wasm/*.wasm (TensorFlow.js wasm backend)
 *   fit-worker.js   fits off the page's thread (the pane's, and worksheet cells' slow methods)
 *   help.html       the help page the manifest's support and learn-more links open
 *
 * `npm run build` = webpack --mode production; `npm start` = webpack serve --mode development, which serves
 * the same files from memory over https on DEV_BASE_URL for sideloading.
 *
 * Usage data: custom-functions-metadata, office-addin-manifest and office-addin-dev-certs all go through
 * office-addin-usage-data, whose installed versions (2.1.x and 3.0.x) have reporting removed: every call is a
 * no-op and nothing prompts, so a build with CI=true, no stdin and no network neither asks nor sends anything.
 */
const fs = require('fs');
const path = require('path');
const CopyWebpackPlugin = require('copy-webpack-plugin');
const CustomFunctionsMetadataPlugin = require('custom-functions-metadata-plugin');
const HtmlWebpackPlugin = require('html-webpack-plugin');

/** The one place for the development base URL; manifest.xml is written against it. */
const DEV_BASE_URL = 'https://localhost:3000/';

/**
 * Where dist/ will be served from. Defaults to the development server; set REMAP_BASE_URL (an https URL
 * ending in "/") when building for another host, and the copied manifest.xml is rewritten to it.
 */
function baseUrl() {
  const url = process.env.REMAP_BASE_URL || DEV_BASE_URL;
  if (!/^https:\/\/[^/]+\/(.*\/)?$/.test(url)) {
    throw new Error(`webpack.config.js: REMAP_BASE_URL is "${url}"; give an https URL ending in "/", e.g. https://example.org/remap/.`);
  }
  return url;
}

/** Code the pane's content security policy would refuse to run: eval and the Function constructor. */
const EVAL_PATTERN = /(?<![\w$.])eval\(|\bnew\s+Function\(|(?<![\w$.])Function\(/;

/**
 * Fails a production build when an emitted script would need 'unsafe-eval' under the page's CSP.
 * Production only: minified output has no comments left to match by accident.
 */
class NoEvalPlugin {
  apply(compiler) {
    if (compiler.options.mode !== 'production') return;
    compiler.hooks.thisCompilation.tap('NoEvalPlugin', (compilation) => {
      compilation.hooks.processAssets.tap({ name: 'NoEvalPlugin', stage: compiler.webpack.Compilation.PROCESS_ASSETS_STAGE_REPORT }, (assets) => {
        for (const [name, source] of Object.entries(assets)) {
          if (!name.endsWith('.js')) continue;
          const text = source.source().toString();
          const m = EVAL_PATTERN.exec(text);
          if (m) {
            const around = text.slice(Math.max(0, m.index - 80), m.index + 80).replace(/\s+/g, ' ');
            compilation.errors.push(
              new compiler.webpack.WebpackError(
                `${name} calls eval or the Function constructor ("...${around}..."), which the pane's content security policy ` +
                  "forbids ('unsafe-eval' is not allowed). Find the module that does it and replace or configure it.",
              ),
            );
          }
        }
      });
    });
  }
}

const FUNCTIONS_SOURCE = './src/functions/functions.ts';
const TASKPANE_SOURCE = './src/taskpane/taskpane.ts';
const FIT_WORKER_SOURCE = './src/fits/worker/fit-worker.ts';

/**
 * Adds top-level flags to the generated functions.json that the metadata generator does not write:
 * allowErrorForDataTypeAny lets error cells reach our `any` parameters, where the coercion rules skip them,
 * instead of Excel refusing to call the function. Runs after CustomFunctionsMetadataPlugin has emitted the file.
 */
class FunctionsMetadataFlagsPlugin {
  constructor(options) {
    this.options = options;
  }
  apply(compiler) {
    const { file, flags } = this.options;
    compiler.hooks.thisCompilation.tap('FunctionsMetadataFlagsPlugin', (compilation) => {
      compilation.hooks.processAssets.tap({ name: 'FunctionsMetadataFlagsPlugin', stage: compiler.webpack.Compilation.PROCESS_ASSETS_STAGE_ADDITIONS }, () => {
        const asset = compilation.getAsset(file);
        if (!asset) return;
        const metadata = JSON.parse(asset.source.source().toString());
        compilation.updateAsset(file, new compiler.webpack.sources.RawSource(JSON.stringify({ ...flags, ...metadata, ...flags }, null, 4)));
      });
    });
  }
}

/**
 * https options for the development server. office-addin-dev-certs makes a local CA and a localhost
 * certificate under ~/.office-addin-dev-certs and asks the OS to trust the CA. Where that step cannot run
 * (no sudo, no desktop keychain, a container), we serve with the generated certificate anyway when it exists,
 * or else with webpack-dev-server's own self-signed one, and say how to trust it.
 */
async function devHttpsOptions() {
  const devCerts = require('office-addin-dev-certs');
  try {
    return await devCerts.getHttpsServerOptions();
  } catch (err) {
    const dir = path.join(require('os').homedir(), '.office-addin-dev-certs');
    const files = { ca: 'ca.crt', cert: 'localhost.crt', key: 'localhost.key' };
    const have = Object.values(files).every((f) => fs.existsSync(path.join(dir, f)));
    console.warn(
      `[remap] Could not install the development CA (${String(err && err.message).split('\n')[0]}).\n` +
        (have
          ? `[remap] Serving with the certificate in ${dir}; trust ${path.join(dir, 'ca.crt')} in your OS or browser, ` +
            'or run "npx office-addin-dev-certs install" in an interactive terminal.'
          : '[remap] Serving with a self-signed certificate from webpack-dev-server; the browser will warn until you trust it.'),
    );
    if (!have) return undefined;
    const read = (f) => fs.readFileSync(path.join(dir, f));
    return { ca: read(files.ca), cert: read(files.cert), key: read(files.key) };
  }
}

module.exports = async (env) => {
  const serving = Boolean(env && env.WEBPACK_SERVE);
  const base = baseUrl();

  return {
    context: __dirname,
    // es2020: webpack's runtime then reads globalThis directly instead of falling back to new Function.
    target: ['web', 'es2020'],
    entry: {
      functions: FUNCTIONS_SOURCE,
      // The pane shares the functions bundle's modules (one map store, one engine) on the shared-runtime page.
      taskpane: { import: TASKPANE_SOURCE, dependOn: 'functions' },
      // Fits (the pane's, and worksheet cells' slow ones) run in a worker, so the page stays responsive and a cancel stops any method at once.
      // A worker has no document to add <script> tags to: chunks loaded lazily there (the trainer) come through importScripts.
      'fit-worker': { import: FIT_WORKER_SOURCE, chunkLoading: 'import-scripts' },
    },
    output: {
      path: path.resolve(__dirname, 'dist'),
      filename: '[name].js',
      clean: true,
    },
    // Never an eval-based devtool: the pane's content security policy forbids eval.
    devtool: 'source-map',
    resolve: {
      extensions: ['.ts', '.js'],
    },
    module: {
      rules: [
        {
          test: /\.ts$/,
          exclude: /node_modules/,
          use: {
            loader: 'ts-loader',
            options: {
              configFile: path.resolve(__dirname, 'tsconfig.json'),
              // ES modules for the bundle (tree shaking); tsconfig.json itself stays commonjs for jest and the CLI.
              compilerOptions: { module: 'es2020', sourceMap: true },
              onlyCompileBundledFiles: true,
              // Types are checked once by `npm run typecheck` (part of `npm test`), not again per bundle.
              transpileOnly: true,
            },
          },
        },
      ],
    },
    plugins: [
      new NoEvalPlugin(),
      new CustomFunctionsMetadataPlugin({ output: 'functions.json', input: FUNCTIONS_SOURCE }),
      new FunctionsMetadataFlagsPlugin({ file: 'functions.json', flags: { allowErrorForDataTypeAny: true } }),
      new HtmlWebpackPlugin({
        filename: 'taskpane.html',
        template: './src/taskpane/taskpane.html',
        // Shared runtime: the pane's page also hosts the worksheet functions.
        chunks: ['functions', 'taskpane'],
        chunksSortMode: 'manual',
      }),
      new CopyWebpackPlugin({
        patterns: [
          {
            from: 'manifest.xml',
            to: 'manifest.xml',
            transform: (content) => (base === DEV_BASE_URL ? content : Buffer.from(content.toString('utf8').split(DEV_BASE_URL).join(base))),
          },
          { from: 'assets/*.png', to: 'assets/[name][ext]' },
          { from: 'src/taskpane/taskpane.css', to: 'taskpane.css' },
          // The help page the manifest's support and learn-more links open (static: no script).
          { from: 'src/help/help.html', to: 'help.html' },
          // The engine calls setWasmPaths('<base>wasm/') in the browser.
          { from: 'node_modules/@tensorflow/tfjs-backend-wasm/dist/*.wasm', to: 'wasm/[name][ext]' },
        ],
      }),
    ],
    performance: {
      // TensorFlow.js makes the functions bundle large; warn only when it grows far beyond that.
      maxAssetSize: 8 * 1024 * 1024,
      maxEntrypointSize: 8 * 1024 * 1024,
    },
    devServer: serving
      ? {
          port: Number(new URL(DEV_BASE_URL).port),
          host: 'localhost',
          static: false,
          headers: { 'Access-Control-Allow-Origin': '*' },
          server: { type: 'https', options: await devHttpsOptions() },
          client: { overlay: false },
          hot: false,
          liveReload: true,
        }
      : undefined,
  };
};

module.exports.DEV_BASE_URL = DEV_BASE_URL;

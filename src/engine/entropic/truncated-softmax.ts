import type { Points } from '../points';
import { SOFTMAX_KERNEL_HEX } from './softmax-wasm';

/**
 * Softmax weights below e^-(TRUNCATION_DIGITS + log m) of the largest are left out: at most m of them, so their total is
 * below e^-TRUNCATION_DIGITS = 9.29e-11 of the largest weight (see `TruncatedSoftmax`). The rest of the 1e-10 budget
 * is for rounding: `LOGIT_ROUNDING` for the logits and about 1.2e-12 for the exponentials and the sums.
 */
export const TRUNCATION_DIGITS = 23.1;

/**
 * The largest relative error the rounding of the product-form logits may put on a kept weight (the per-row bound rho(x)
 * of `TruncatedSoftmax`); a row whose bound is larger is computed by sums of squared differences instead.
 */
export const LOGIT_ROUNDING = 5e-12;

/** Table entries per unit of the exponent in `tableExpWeights` (written out as 64 and 1/64 = 0.015625 in its loop). */
const STEPS = 64;
/** Unit roundoff of float64, 2^-53. */
const UNIT_ROUNDOFF = 2 ** -53;

/**
 * The table `tableExpWeights` reads, for exponents down to -span: entry k is Math.exp(-k / 64) for k < K = floor(64 span) + 1,
 * and entry K is 0. O(64 span) time and memory (2,025 entries, 16 kB, for span = 23.1 + log 5,000).
 * @param span the largest |z| that must come out exact to `tableExpWeights`'s bound (> 0, finite).
 * @example expTable(23.1 + Math.log(4000)) // 2,011 entries: exp(0), exp(-1/64), ..., exp(-2009/64), 0
 */
export function expTable(span: number): Float64Array {
  const last = Math.floor(span * STEPS) + 1;
  const table = new Float64Array(last + 1);
  for (let k = 0; k < last; k++) table[k] = Math.exp(-k / STEPS);
  return table;
}

/**
 * weight[t] = exp(z_t), z_t = (top - values[t]) * scale <= 0, for t < count, from a table and a short polynomial; returns
 * their sum. With k = floor(-64 z) and r = z + k / 64 in (-1/64, 0] (computed exactly: the subtraction is exact by
 * Sterbenz's lemma), exp(z) = exp(-k / 64) exp(r), with exp(r) by its Taylor polynomial of degree 5 (evaluated in
 * Estrin's order). The Taylor remainder is below (1/64)^6 / 6! = 2.02e-14 relative, so with the table's and the
 * polynomial's roundings the relative error against the exact exp is at most 2.1e-14 for every z in (-K / 64, 0]
 * (K + 1 = table length), which covers [-span, 0]; z <= -K / 64, -Infinity and NaN give 0. About a third of
 * Math.exp's time in V8. One function for the whole list, so that the loop is compiled on its own. O(count).
 * @param table from `expTable` (its last entry 0).
 * @param values count numbers with (top - values[t]) * scale <= 0 (the kernel's: candidate s_j, top = their minimum,
 *   scale = 1 / (2 eps)).
 * @param weight receives the count weights (length >= count).
 * @example tableExpWeights(expTable(30), Float64Array.of(2.5), 1, 0, 1, w) // w[0] = 0.08208499862389..., Math.exp(-2.5) to 2.1e-14
 */
export function tableExpWeights(table: Float64Array, values: Float64Array, count: number, top: number, scale: number, weight: Float64Array): number {
  // 64 = STEPS and 0.015625 = 1 / STEPS, written out.
  const floor = -(table.length - 1) / 64;
  let total = 0;
  for (let t = 0; t < count; t++) {
    const z = (top - values[t]) * scale;
    const zc = z > floor ? z : floor;
    const k = (zc * -64) | 0;
    const r = zc + k * 0.015625;
    const r2 = r * r;
    const w = table[k] * (1 + r + r2 * (0.5 + r * (1 / 6) + r2 * (1 / 24 + r * (1 / 120))));
    weight[t] = w;
    total += w;
  }
  return total;
}

/** sums[k] = sum_t weight[t] yc[base + 8 cand[t] + k], k < 8, in t order. O(8 count). */
function weightedSums8(yc: Float64Array, base: number, cand: Int32Array, weight: Float64Array, count: number, sums: Float64Array): void {
  let a0 = 0;
  let a1 = 0;
  let a2 = 0;
  let a3 = 0;
  let a4 = 0;
  let a5 = 0;
  let a6 = 0;
  let a7 = 0;
  for (let t = 0; t < count; t++) {
    const w = weight[t];
    const p = base + cand[t] * 8;
    a0 += w * yc[p];
    a1 += w * yc[p + 1];
    a2 += w * yc[p + 2];
    a3 += w * yc[p + 3];
    a4 += w * yc[p + 4];
    a5 += w * yc[p + 5];
    a6 += w * yc[p + 6];
    a7 += w * yc[p + 7];
  }
  sums[0] = a0;
  sums[1] = a1;
  sums[2] = a2;
  sums[3] = a3;
  sums[4] = a4;
  sums[5] = a5;
  sums[6] = a6;
  sums[7] = a7;
}

/** sums[k] = sum_t weight[t] yc[base + 4 cand[t] + k], k < 4, in t order. O(4 count). */
function weightedSums4(yc: Float64Array, base: number, cand: Int32Array, weight: Float64Array, count: number, sums: Float64Array): void {
  let a0 = 0;
  let a1 = 0;
  let a2 = 0;
  let a3 = 0;
  for (let t = 0; t < count; t++) {
    const w = weight[t];
    const p = base + cand[t] * 4;
    a0 += w * yc[p];
    a1 += w * yc[p + 1];
    a2 += w * yc[p + 2];
    a3 += w * yc[p + 3];
  }
  sums[0] = a0;
  sums[1] = a1;
  sums[2] = a2;
  sums[3] = a3;
}

/** The exports of softmax-kernel.wat (pointers are byte offsets into the instance's memory). */
interface KernelExports {
  pass(
    width: number,
    m: number,
    yc: number,
    xv: number,
    c: number,
    dist: number,
    first: number,
    last: number,
    band: number,
    cand0: number,
    cand1: number,
    vals0: number,
    vals1: number,
    head: number,
  ): void;
  weights(vals: number, count: number, top: number, scale: number, table: number, floor: number, weight: number): void;
  sums(width: number, yc: number, cand: number, weight: number, count: number, out: number): number;
}

/** A WebAssembly instance of the kernel with its memory, and where each array lives in it (byte offsets). */
interface WasmKernel {
  run: KernelExports;
  f64: Float64Array;
  i32: Int32Array;
  yc: number;
  c: number;
  dist: number;
  xv: number;
  head: number;
  cand: [number, number];
  vals: [number, number];
  weight: number;
  table: number;
  sums: number;
}

let compiled: WebAssembly.Module | null | undefined;

/**
 * The kernel's WebAssembly module (softmax-kernel.wat, about 1.1 kB, so a synchronous compile is allowed on a browser's
 * main thread), compiled on first use; null where WebAssembly or its SIMD instructions are missing (the compile throws
 * there), and the TypeScript kernel runs instead. Never throws. O(module size) once.
 * @example softmaxWasmModule() // a WebAssembly.Module in Node 20, Chromium and Edge WebView2
 */
export function softmaxWasmModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    compiled = null;
    try {
      if (typeof WebAssembly === 'object') {
        const hex = SOFTMAX_KERNEL_HEX;
        const bytes = new Uint8Array(hex.length / 2);
        for (let t = 0; t < bytes.length; t++) bytes[t] = parseInt(hex.slice(2 * t, 2 * t + 2), 16);
        compiled = new WebAssembly.Module(bytes);
      }
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

/** Which implementation of the kernel's passes runs: WebAssembly SIMD, or the plain TypeScript loops. */
export type SoftmaxKernelName = 'wasm' | 'typescript';

/**
 * The entropic map of Pooladian & Niles-Weed (2021, "Entropic estimation of optimal transport maps", arXiv 2109.12004)
 * on new rows, T(x) = sum_j y_j w_j(x), w_j = softmax_j(h_j - |x - y_j|^2 / (2 eps)), with the negligible weights left
 * out. It is the same formula as `barycentricMap`, so it is still the gradient of a convex function.
 *
 * Method. With H = max_j h_j and r_j^2 = 2 eps (H - h_j) >= 0 the logit is H - D_j / (2 eps), D_j = |x - y_j|^2 + r_j^2.
 * |x|^2 is common to every j and cancels in the softmax, so the kernel works with the product form
 *   s_j = c_j - 2 x.y_j,  c_j = |y_j|^2 + r_j^2 (fixed at construction), D_j = s_j + |x|^2,
 * d multiply-adds per row and target, taken two rows at a time with the coordinates held in locals (the support is
 * stored in chunks of 8 or 4 zero-padded columns). The same pass keeps the running minimum of s_j and lists the
 * candidates s_j <= (running minimum) + band, band = 2 eps (23.1 + log m); the rows kept in the end, those within band
 * of the final minimum, are among them, so no second test over all m is needed. Only candidates are exponentiated
 * (`tableExpWeights`, z = (minimum - s_j) / (2 eps)) and summed into the weighted average.
 *
 * Two kernels. Where WebAssembly with its SIMD instructions compiles (Node 20, Chromium, Edge WebView2), the product
 * pass, the exponentials and the weighted sums run in softmax-kernel.wat on f64x2 vectors: in the product pass the two
 * lanes are the two rows of the pass (each target's coordinates are loaded once and broadcast), in the exponentials two
 * candidates, in the weighted sums two coordinates. Elsewhere (or with kernel 'typescript') the TypeScript loops below
 * run. Both perform the same float64 operations (no fused multiply-add) with the same association in every lane, so
 * they give the same bits; the tests check it. The one operation that differs, the running minimum (f64x2.pmin, t < b ?
 * t : b, where the TypeScript loop takes Math.min), gives another result only for a NaN s_j (no later value changes for
 * a tie of +0 and -0), and a row with a NaN or infinite s_j has a NaN or infinite |x|^2 (a non-finite x, or one whose
 * square overflows), so its rho(x) sends it to squared differences, which discard the pass's minimum and candidates.
 * Were the summation orders of the two kernels ever to differ, only the rounding would change, not the magnitudes below:
 * the bound holds for any order.
 *
 * Error, against the untruncated map T(x) evaluated exactly:
 * - truncation: every target left out has weight below e^-(23.1 + log m) of the largest, so together they weigh less
 *   than e^-23.1 = 9.29e-11 of the kept total, and the average moves by at most 9.29e-11 x diameter (the diameter of the
 *   support rows: two averages of the same rows whose weights differ by that share);
 * - logits: the product form rounds s_j to within gamma (c_j + 2 |x| |y_j|), gamma = (d + 4) u / (1 - (d + 4) u),
 *   u = 2^-53, where sums of squared differences round to within gamma D_j. A kept target has r_j^2 <= D_min + band,
 *   and |x - y_j|^2 <= D_min + band, so |y_j| <= Y(x) = min(max_j |y_j|, |x| + sqrt(D_min + band)) and each kept
 *   weight is off by a relative rho(x) = gamma (Y(x)^2 + 2 |x| Y(x) + D_min + band) / (2 eps) at most (a target left
 *   out by rounding alone obeys the same bounds), and the average by rho(x) x diameter. The kernel computes rho(x) for
 *   every row (O(d)) and takes a row with rho(x) > LOGIT_ROUNDING = 5e-12 by sums of squared differences instead,
 *   which leaves gamma (D_min + band) / (2 eps), the rounding any float64 evaluation of the logits has (barycentricMap's
 *   too);
 * - the exponentials (2.1e-14 relative, plus 3 u |z| <= 1.1e-14 from forming z) and the two sums over at most m
 *   targets (below 2 (m + 1) u Y <= 1.2e-12 Y for m <= 5,000, Y = max_j |y_j| <= diameter when the support is centred,
 *   as fitted units are).
 * Together, for rows with gamma (D_min + band) / (2 eps) <= 5e-12, D_min = min_j D_j (at d = 8 and the default
 * smoothing, eps = 0.063: D_min up to 467 squared standardised units, about 21 units from the nearest target):
 *   |T_kernel(x) - T(x)| <= (9.29e-11 + 5e-12 + 1.3e-12) x diameter < 1e-10 x diameter.
 * On the bench zoo's report half at d = 8 (n = m = 4,000, default smoothing, 1,000 fresh rows per family) rho(x) stayed
 * below 1.3e-12 (no row needed squared differences; at d = 2, 15 of 1,000 skewed rows did), and the largest distance to
 * barycentricMap was 1.5e-12 x diameter (rounding of both; the truncation's share is far below its bound).
 *
 * Speed. At the default smoothing the kept set is large: on that bench the median row keeps 2,905 of 4,000 targets
 * (skewed family), 2,609 (shifted), 1,708 (clustered) and 2,599 (tied), and the candidates exceed the kept rows by 2-6 %.
 * A row costs m d multiply-adds for the products, one table exponential and d multiply-adds per candidate. At m = 4,000,
 * d = 8 on one thread the TypeScript kernel took 28-33 us per row bundled with esbuild and run in Node, 34-39 us under
 * the bench's tsx loader, against 70-84 and 99-124 us for the sums of squared differences with Math.exp it replaced
 * (one run of both, load average 0.9). The WebAssembly kernel takes 12-14 us per row on those families under tsx against
 * 34-41 us for the TypeScript one in the same run (2.9-3.0x), and 12-20 us against 30-43 us compiled by tsc and run in
 * plain Node (2.1-2.7x; one run, load average 0.8-1.2; `npm run build:cli`, then
 * `npm run bench -- entropic-zoo --rows 100000 --compiled` prints both kernels' CPU time per 1,000,000 rows).
 *
 * Row independence: every number a row's result depends on is computed by the same operations in the same order
 * whichever row shares its pass (an odd last row is paired with itself), so a row's result is bit-identical whether it
 * is mapped alone or in any batch, and rows may be split across workers freely.
 * Cost: O(r m d) for r rows, plus O(candidates d) per row; O(m d) for the chunked support and O(7 m) scratch (with the
 * WebAssembly kernel, a memory of its own of O(m d) bytes holding a copy of them).
 */
export class TruncatedSoftmax {
  /** The implementation that runs the passes ('wasm' wherever WebAssembly SIMD compiles, unless 'typescript' was asked for). */
  readonly kernel: SoftmaxKernelName;
  private readonly wasm: WasmKernel | null = null;
  private readonly d: number;
  private readonly m: number;
  /** The support rows, row-major as given (for rows computed by squared differences). */
  private readonly y: Float64Array;
  /** The support in chunks of 8 or 4 columns (zero-padded), chunk by chunk: chunk q holds m x width[q] values. */
  private readonly yc: Float64Array;
  private readonly widths: number[];
  private readonly padded: number;
  private readonly r2: Float64Array;
  private readonly c: Float64Array;
  private readonly band: number;
  private readonly inv2Eps: number;
  private readonly table: Float64Array;
  /** max_j |y_j|^2 and gamma / (2 eps), gamma = (d + 4) u / (1 - (d + 4) u), for the per-row rounding check rho(x). */
  private readonly yMax2: number;
  private readonly gammaOver2Eps: number;
  private readonly dist0: Float64Array;
  private readonly dist1: Float64Array;
  /** In the WebAssembly kernel, these five are views of its memory. */
  private readonly cand0: Int32Array;
  private readonly cand1: Int32Array;
  /** The candidates' s_j, in candidate order (lane 0 and 1). */
  private readonly vals0: Float64Array;
  private readonly vals1: Float64Array;
  private readonly weight: Float64Array;
  private readonly sums = new Float64Array(8);
  /** -2 x for the two rows of a pass, zero-padded to `padded` columns each. */
  private readonly xs: Float64Array;
  /** Per pass: running minimum and candidate count of each lane. */
  private best0 = 0;
  private best1 = 0;
  private count0 = 0;
  private count1 = 0;

  /**
   * @param support the rows y_j (m >= 1); h the logit offsets log b_j + g_j / eps (length m, finite); eps > 0.
   * Kept by reference, never mutated.
   * @param kernel 'auto' (the default): the WebAssembly SIMD passes where they compile, the TypeScript ones otherwise;
   *   'typescript': the TypeScript passes always (both give the same bits).
   * @example new TruncatedSoftmax(target, h, 0.05).map(x) // barycentricMap(x, target, logMass, g, 0.05) to 1e-10 x diameter
   */
  constructor(support: Points, h: Float64Array, eps: number, kernel: 'auto' | 'typescript' = 'auto') {
    const { n: m, d, data } = support;
    this.d = d;
    this.m = m;
    this.y = data;
    this.inv2Eps = 1 / (2 * eps);
    const span = TRUNCATION_DIGITS + Math.log(m);
    this.band = 2 * eps * span;
    this.table = expTable(span);
    let H = -Infinity;
    for (let j = 0; j < m; j++) if (h[j] > H) H = h[j];
    this.r2 = new Float64Array(m);
    for (let j = 0; j < m; j++) this.r2[j] = 2 * eps * (H - h[j]);
    this.widths = [];
    for (let left = d; left > 0; left -= 8) this.widths.push(left > 4 ? 8 : 4);
    this.padded = this.widths.reduce((s, w) => s + w, 0);
    this.yc = new Float64Array(m * this.padded);
    this.c = new Float64Array(m);
    let yMax2 = 0;
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let k = 0; k < d; k++) {
        const v = data[j * d + k];
        s += v * v;
        const q = k >> 3;
        this.yc[m * 8 * q + j * this.widths[q] + (k & 7)] = v;
      }
      if (s > yMax2) yMax2 = s;
      this.c[j] = s + this.r2[j];
    }
    this.yMax2 = yMax2;
    const gamma = ((d + 4) * UNIT_ROUNDOFF) / (1 - (d + 4) * UNIT_ROUNDOFF);
    this.gammaOver2Eps = gamma * this.inv2Eps;
    this.dist0 = new Float64Array(m);
    this.dist1 = new Float64Array(m);
    this.xs = new Float64Array(2 * this.padded);
    const module = kernel === 'auto' ? softmaxWasmModule() : null;
    const wasm = module ? this.instantiate(module) : null;
    if (wasm) {
      this.wasm = wasm;
      this.kernel = 'wasm';
      this.cand0 = wasm.i32.subarray(wasm.cand[0] >> 2, (wasm.cand[0] >> 2) + m);
      this.cand1 = wasm.i32.subarray(wasm.cand[1] >> 2, (wasm.cand[1] >> 2) + m);
      this.vals0 = wasm.f64.subarray(wasm.vals[0] >> 3, (wasm.vals[0] >> 3) + m);
      this.vals1 = wasm.f64.subarray(wasm.vals[1] >> 3, (wasm.vals[1] >> 3) + m);
      this.weight = wasm.f64.subarray(wasm.weight >> 3, (wasm.weight >> 3) + m);
    } else {
      this.kernel = 'typescript';
      this.cand0 = new Int32Array(m);
      this.cand1 = new Int32Array(m);
      this.vals0 = new Float64Array(m);
      this.vals1 = new Float64Array(m);
      this.weight = new Float64Array(m);
    }
  }

  /**
   * An instance of the WebAssembly kernel with a memory of its own holding the chunked support, c, the exponential's
   * table and the scratch arrays; null when instantiation fails (no memory), and the TypeScript passes run.
   */
  private instantiate(module: WebAssembly.Module): WasmKernel | null {
    const { m, padded, table } = this;
    let end = 96; // bytes 0..31: the pass's counts and minima (head); 32..95: the sums
    const take = (bytes: number): number => {
      const at = end;
      end += Math.ceil(bytes / 16) * 16;
      return at;
    };
    const yc = take(8 * m * padded);
    const c = take(8 * m);
    const dist = take(16 * m);
    const xv = take(16 * padded);
    const cand: [number, number] = [take(4 * m), take(4 * m)];
    // One more value and weight than targets: `weights` works on pairs and may read and write one past the count.
    const vals: [number, number] = [take(8 * m + 8), take(8 * m + 8)];
    const weight = take(8 * m + 8);
    const tableAt = take(8 * table.length);
    try {
      const memory = new WebAssembly.Memory({ initial: Math.ceil(end / 65536) });
      const run = new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as KernelExports;
      const f64 = new Float64Array(memory.buffer);
      f64.set(this.yc, yc >> 3);
      f64.set(this.c, c >> 3);
      f64.set(table, tableAt >> 3);
      return { run, f64, i32: new Int32Array(memory.buffer), yc, c, dist, xv, head: 0, cand, vals, weight, table: tableAt, sums: 32 };
    } catch {
      return null;
    }
  }

  /**
   * T(x) for every row of x, into out (row-major x.n x d). O(x.n m d).
   * @param x rows in the support's units (x.d = d).
   * @example softmax.map(points([[0, 0]])) // one mapped row
   */
  map(x: Points, out: Float64Array = new Float64Array(x.n * this.d)): Float64Array {
    const { d, padded, xs, wasm } = this;
    const xd = x.data;
    const sqrt = Math.sqrt;
    for (let i = 0; i < x.n; i += 2) {
      const i1 = i + 1 < x.n ? i + 1 : i;
      if (wasm) {
        // a_k = (-2 x_k of row i, -2 x_k of row i1), zero-padded, for the WebAssembly pass (lanes = the two rows).
        const f = wasm.f64;
        for (let k = 0, at = wasm.xv >> 3; k < padded; k++, at += 2) {
          f[at] = k < d ? -2 * xd[i * d + k] : 0;
          f[at + 1] = k < d ? -2 * xd[i1 * d + k] : 0;
        }
        this.wasmProducts(wasm);
      } else {
        xs.fill(0);
        for (let k = 0; k < d; k++) {
          xs[k] = -2 * xd[i * d + k];
          xs[padded + k] = -2 * xd[i1 * d + k];
        }
        this.products();
      }
      this.finish(xd, i * d, 0, this.count0, this.best0, out, sqrt);
      if (i1 !== i) this.finish(xd, i1 * d, 1, this.count1, this.best1, out, sqrt);
    }
    return out;
  }

  /** `products` in WebAssembly: one call per chunk, then the counts and minima read from its memory. */
  private wasmProducts(wasm: WasmKernel): void {
    const { m, widths, band } = this;
    const last = widths.length - 1;
    for (let q = 0, start = 0; q <= last; start += widths[q], q++) {
      wasm.run.pass(
        widths[q],
        m,
        wasm.yc + 8 * m * start,
        wasm.xv + 16 * start,
        wasm.c,
        wasm.dist,
        q === 0 ? 1 : 0,
        q === last ? 1 : 0,
        band,
        wasm.cand[0],
        wasm.cand[1],
        wasm.vals[0],
        wasm.vals[1],
        wasm.head,
      );
    }
    this.count0 = wasm.i32[wasm.head >> 2];
    this.count1 = wasm.i32[(wasm.head >> 2) + 1];
    this.best0 = wasm.f64[(wasm.head >> 3) + 1];
    this.best1 = wasm.f64[(wasm.head >> 3) + 2];
  }

  /** One row's result from its pass, or by squared differences when the product form's rounding is too large. */
  private finish(xd: Float64Array, o: number, lane: 0 | 1, count: number, best: number, out: Float64Array, sqrt: (v: number) => number): void {
    const d = this.d;
    const dist = lane ? this.dist1 : this.dist0;
    const vals = lane ? this.vals1 : this.vals0;
    const cand = lane ? this.cand1 : this.cand0;
    let xx = 0;
    for (let k = 0; k < d; k++) xx += xd[o + k] * xd[o + k];
    const reach = (best + xx > 0 ? best + xx : 0) + this.band;
    const norm = sqrt(xx);
    const yMax = sqrt(this.yMax2);
    const yKept = norm + sqrt(reach) < yMax ? norm + sqrt(reach) : yMax;
    const rho = this.gammaOver2Eps * (yKept * yKept + 2 * norm * yKept + reach);
    if (rho > LOGIT_ROUNDING || !(rho >= 0)) {
      best = this.differences(xd, o, dist);
      count = this.candidates(dist, best, cand, vals);
    }
    this.average(lane, count, best, out, o);
  }

  /**
   * s_j = c_j - 2 x.y_j for both rows of the pass, chunk by chunk (partial sums in dist0 / dist1), with the running
   * minimum, the candidates and their values (cand, vals) from the last chunk. Each lane's sums run in the same order
   * whatever the other lane holds.
   */
  private products(): void {
    const { m, yc, c, widths, padded, xs, band, dist0, dist1, cand0, cand1, vals0, vals1 } = this;
    const min = Math.min;
    let b0 = Infinity;
    let b1 = Infinity;
    let n0 = 0;
    let n1 = 0;
    for (let q = 0, start = 0; q < widths.length; start += widths[q], q++) {
      const s0 = q === 0 ? c : dist0;
      const s1 = q === 0 ? c : dist1;
      // Only a chunk before the last stores its partial sums; the last one's values go to the candidate lists.
      const partial = q < widths.length - 1;
      const base = m * start;
      let l0 = Infinity;
      let l1 = Infinity;
      b0 = Infinity;
      b1 = Infinity;
      n0 = 0;
      n1 = 0;
      if (widths[q] === 8) {
        const a0 = xs[start];
        const a1 = xs[start + 1];
        const a2 = xs[start + 2];
        const a3 = xs[start + 3];
        const a4 = xs[start + 4];
        const a5 = xs[start + 5];
        const a6 = xs[start + 6];
        const a7 = xs[start + 7];
        const e0 = xs[padded + start];
        const e1 = xs[padded + start + 1];
        const e2 = xs[padded + start + 2];
        const e3 = xs[padded + start + 3];
        const e4 = xs[padded + start + 4];
        const e5 = xs[padded + start + 5];
        const e6 = xs[padded + start + 6];
        const e7 = xs[padded + start + 7];
        for (let j = 0, p = base; j < m; j++, p += 8) {
          const y0 = yc[p];
          const y1 = yc[p + 1];
          const y2 = yc[p + 2];
          const y3 = yc[p + 3];
          const y4 = yc[p + 4];
          const y5 = yc[p + 5];
          const y6 = yc[p + 6];
          const y7 = yc[p + 7];
          const t0 = s0[j] + (a0 * y0 + a1 * y1 + (a2 * y2 + a3 * y3) + (a4 * y4 + a5 * y5 + (a6 * y6 + a7 * y7)));
          const t1 = s1[j] + (e0 * y0 + e1 * y1 + (e2 * y2 + e3 * y3) + (e4 * y4 + e5 * y5 + (e6 * y6 + e7 * y7)));
          if (partial) {
            dist0[j] = t0;
            dist1[j] = t1;
          }
          b0 = min(b0, t0);
          l0 = b0 + band;
          b1 = min(b1, t1);
          l1 = b1 + band;
          cand0[n0] = j;
          vals0[n0] = t0;
          n0 += +(t0 <= l0);
          cand1[n1] = j;
          vals1[n1] = t1;
          n1 += +(t1 <= l1);
        }
      } else {
        const a0 = xs[start];
        const a1 = xs[start + 1];
        const a2 = xs[start + 2];
        const a3 = xs[start + 3];
        const e0 = xs[padded + start];
        const e1 = xs[padded + start + 1];
        const e2 = xs[padded + start + 2];
        const e3 = xs[padded + start + 3];
        for (let j = 0, p = base; j < m; j++, p += 4) {
          const y0 = yc[p];
          const y1 = yc[p + 1];
          const y2 = yc[p + 2];
          const y3 = yc[p + 3];
          const t0 = s0[j] + (a0 * y0 + a1 * y1 + (a2 * y2 + a3 * y3));
          const t1 = s1[j] + (e0 * y0 + e1 * y1 + (e2 * y2 + e3 * y3));
          if (partial) {
            dist0[j] = t0;
            dist1[j] = t1;
          }
          b0 = min(b0, t0);
          l0 = b0 + band;
          b1 = min(b1, t1);
          l1 = b1 + band;
          cand0[n0] = j;
          vals0[n0] = t0;
          n0 += +(t0 <= l0);
          cand1[n1] = j;
          vals1[n1] = t1;
          n1 += +(t1 <= l1);
        }
      }
    }
    this.best0 = b0;
    this.best1 = b1;
    this.count0 = n0;
    this.count1 = n1;
  }

  /** D_j = |x - y_j|^2 + r_j^2 by squared differences for the row at xd[o..o+d) into dist; returns the smallest. O(m d). */
  private differences(xd: Float64Array, o: number, dist: Float64Array): number {
    const { d, m, y, r2 } = this;
    let best = Infinity;
    for (let j = 0, yo = 0; j < m; j++, yo += d) {
      let s = 0;
      for (let k = 0; k < d; k++) {
        const t = xd[o + k] - y[yo + k];
        s += t * t;
      }
      s += r2[j];
      dist[j] = s;
      if (s < best) best = s;
    }
    return best;
  }

  /** The targets with dist <= best + band into cand, their values into vals; returns their count. O(m). */
  private candidates(dist: Float64Array, best: number, cand: Int32Array, vals: Float64Array): number {
    const limit = best + this.band;
    let n = 0;
    for (let j = 0; j < this.m; j++) {
      cand[n] = j;
      vals[n] = dist[j];
      n += dist[j] <= limit ? 1 : 0;
    }
    return n;
  }

  /** The weighted average of the lane's candidate targets (indices cand, values s_j in vals), into out[o..o+d). O(count d). */
  private average(lane: 0 | 1, count: number, best: number, out: Float64Array, o: number): void {
    const { d, m, yc, widths, weight, sums, wasm } = this;
    if (wasm) {
      const floor = -(this.table.length - 1) / 64;
      wasm.run.weights(wasm.vals[lane], count, best, this.inv2Eps, wasm.table, floor, wasm.weight);
      let total = 0;
      for (let q = 0, start = 0; q < widths.length; start += widths[q], q++) {
        total = wasm.run.sums(widths[q], wasm.yc + 8 * m * start, wasm.cand[lane], wasm.weight, count, wasm.sums);
        for (let k = start, at = wasm.sums >> 3; k < d && k < start + widths[q]; k++) out[o + k] = wasm.f64[at + k - start] / total;
      }
      return;
    }
    const vals = lane ? this.vals1 : this.vals0;
    const cand = lane ? this.cand1 : this.cand0;
    const total = tableExpWeights(this.table, vals, count, best, this.inv2Eps, weight);
    for (let q = 0, start = 0; q < widths.length; start += widths[q], q++) {
      if (widths[q] === 8) weightedSums8(yc, m * start, cand, weight, count, sums);
      else weightedSums4(yc, m * start, cand, weight, count, sums);
      for (let k = start; k < d && k < start + widths[q]; k++) out[o + k] = sums[k - start] / total;
    }
  }
}

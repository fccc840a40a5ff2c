#!/usr/bin/env node
'use strict';
/**
 * Draws the Remap icons (assets/icon-<size>.png for 16, 32, 64, 80 and 128 px) with Node built-ins only.
 *
 * The design: a rounded teal square holding two rising curves, a light one (the source) and a
 * bright one (the target), with a small arrow joining them: "one distribution mapped onto another".
 * Everything is drawn from the pixel grid with 4x4 supersampling, so the output is deterministic:
 * the same script gives byte-identical files on every machine (zlib level 9, no timestamps in the PNG).
 *
 * Cost: O(size^2 * 16) per icon, well under a second for all five.
 * Usage: node scripts/make-icons.js [outDir]   (outDir defaults to assets/ beside this repo's root)
 * @example node scripts/make-icons.js   // writes assets/icon-16.png ... assets/icon-128.png
 */
const fs = require('fs');
const path = require('path');
const zlib = require('zlib');

// Local names for Math and Infinity: hot loops that look up globals run ~100x slower in a vm context (jest).
const { sqrt, min, max, round } = Math;
const INF = Number.POSITIVE_INFINITY;

const SIZES = [16, 32, 64, 80, 128];
const SUPERSAMPLE = 4;

/** Colours as [r, g, b]. */
const BACKGROUND = [16, 110, 120];
const SOURCE_CURVE = [190, 230, 232];
const TARGET_CURVE = [255, 196, 64];

// Source: PNG specification (W3C, 2nd ed.), section 5.5: CRC-32 over chunk type and data.
const CRC_TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

function crc32(buf) {
  let c = 0xffffffff;
  for (let i = 0; i < buf.length; i++) c = CRC_TABLE[(c ^ buf[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length, 0);
  const typeAndData = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typeAndData), 0);
  return Buffer.concat([len, typeAndData, crc]);
}

/** Encodes straight (non-premultiplied) RGBA pixels as a PNG: 8-bit RGBA, filter 0 on every row. */
function encodePng(width, height, rgba) {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 6; // colour type RGBA
  header[10] = 0; // deflate
  header[11] = 0; // adaptive filtering
  header[12] = 0; // no interlace
  const stride = width * 4;
  const raw = Buffer.alloc((stride + 1) * height);
  for (let y = 0; y < height; y++) {
    raw[y * (stride + 1)] = 0;
    rgba.copy(raw, y * (stride + 1) + 1, y * stride, (y + 1) * stride);
  }
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk('IHDR', header), chunk('IDAT', zlib.deflateSync(raw, { level: 9 })), chunk('IEND', Buffer.alloc(0))]);
}

/** Distance from (px, py) to the segment (ax, ay)-(bx, by). */
function segmentDistance(px, py, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const t = max(0, min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy)));
  const ex = ax + t * dx - px;
  const ey = ay + t * dy - py;
  return sqrt(ex * ex + ey * ey);
}

/** A rising S-curve in unit coordinates (y grows downward), sampled as a polyline. */
function curve(x0, x1, yLow, yHigh, steps) {
  const pts = [];
  for (let i = 0; i <= steps; i++) {
    const t = i / steps;
    const s = t * t * (3 - 2 * t); // smoothstep: monotone, like a distribution function
    pts.push([x0 + (x1 - x0) * t, yLow + (yHigh - yLow) * s]);
  }
  return pts;
}

function polylineDistance(px, py, pts) {
  let best = INF;
  for (let i = 1; i < pts.length; i++) {
    const d = segmentDistance(px, py, pts[i - 1][0], pts[i - 1][1], pts[i][0], pts[i][1]);
    if (d < best) best = d;
  }
  return best;
}

/** Inside test for a rounded square covering [m, 1-m]^2 with corner radius r (unit coordinates). */
function insideRoundedSquare(x, y, m, r) {
  const cx = min(max(x, m + r), 1 - m - r);
  const cy = min(max(y, m + r), 1 - m - r);
  const dx = x - cx;
  const dy = y - cy;
  return x >= m && x <= 1 - m && y >= m && y <= 1 - m && dx * dx + dy * dy <= r * r;
}

/** The shapes of one icon in unit coordinates; line widths grow on small icons so they stay visible. */
function geometry(size) {
  const width = size <= 16 ? 0.075 : size <= 32 ? 0.06 : 0.045;
  return {
    margin: size <= 16 ? 0.02 : 0.04,
    width,
    source: curve(0.14, 0.5, 0.84, 0.3, 24),
    target: curve(0.5, 0.86, 0.7, 0.16, 24),
    // The arrow from the source curve towards the target curve: a shaft and two barbs (too small below 32 px).
    arrow:
      size >= 32
        ? [
            [0.42, 0.5, 0.57, 0.5],
            [0.57, 0.5, 0.515, 0.445],
            [0.57, 0.5, 0.515, 0.555],
          ]
        : [],
  };
}

/** The colour of one sub-sample at unit coordinates (x, y), or null outside the rounded square. */
function shade(x, y, g) {
  if (!insideRoundedSquare(x, y, g.margin, 0.18)) return null;
  if (polylineDistance(x, y, g.target) <= g.width) return TARGET_CURVE;
  if (polylineDistance(x, y, g.source) <= g.width * 0.8) return SOURCE_CURVE;
  for (const [ax, ay, bx, by] of g.arrow) {
    if (segmentDistance(x, y, ax, ay, bx, by) <= g.width * 0.6) return TARGET_CURVE;
  }
  return BACKGROUND;
}

/** Renders one icon as RGBA, averaging SUPERSAMPLE^2 sub-samples per pixel. */
function render(size) {
  const rgba = Buffer.alloc(size * size * 4);
  const n = SUPERSAMPLE * SUPERSAMPLE;
  const shapes = geometry(size);
  for (let py = 0; py < size; py++) {
    for (let px = 0; px < size; px++) {
      let r = 0;
      let g = 0;
      let b = 0;
      let covered = 0;
      for (let sy = 0; sy < SUPERSAMPLE; sy++) {
        for (let sx = 0; sx < SUPERSAMPLE; sx++) {
          const c = shade((px + (sx + 0.5) / SUPERSAMPLE) / size, (py + (sy + 0.5) / SUPERSAMPLE) / size, shapes);
          if (c) {
            r += c[0];
            g += c[1];
            b += c[2];
            covered++;
          }
        }
      }
      const o = (py * size + px) * 4;
      if (covered > 0) {
        rgba[o] = round(r / covered);
        rgba[o + 1] = round(g / covered);
        rgba[o + 2] = round(b / covered);
        rgba[o + 3] = round((255 * covered) / n);
      }
    }
  }
  return rgba;
}

function main() {
  const outDir = path.resolve(process.argv[2] || path.join(__dirname, '..', 'assets'));
  fs.mkdirSync(outDir, { recursive: true });
  for (const size of SIZES) {
    const file = path.join(outDir, `icon-${size}.png`);
    fs.writeFileSync(file, encodePng(size, size, render(size)));
    console.log(`wrote ${path.relative(process.cwd(), file)}`);
  }
}

if (require.main === module) main();

module.exports = { SIZES, encodePng, render };

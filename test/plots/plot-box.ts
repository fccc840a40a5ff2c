/** The plot area of an SVG from src/plots, read from its axis path "M left top V bottom H right". */
export function plotBox(svg: string): { left: number; top: number; bottom: number; right: number } {
  const m = /<path d="M([\d.-]+) ([\d.-]+)V([\d.-]+)H([\d.-]+)" fill="none" stroke="#222222"/.exec(svg);
  if (!m) throw new Error('no axis path');
  return { left: Number(m[1]), top: Number(m[2]), bottom: Number(m[3]), right: Number(m[4]) };
}

/** Every coordinate pair in a path's d attribute, following M/L/H/V commands (absolute). */
export function pathPoints(d: string): [number, number][] {
  const out: [number, number][] = [];
  let x = 0;
  let y = 0;
  const re = /([MLHVZ])\s*([\d.-]+)?(?:\s+([\d.-]+))?/g;
  for (let m = re.exec(d); m; m = re.exec(d)) {
    const [, cmd, a, b] = m;
    if (cmd === 'M' || cmd === 'L') {
      x = Number(a);
      y = Number(b);
    } else if (cmd === 'H') x = Number(a);
    else if (cmd === 'V') y = Number(a);
    else continue;
    out.push([x, y]);
  }
  return out;
}

/** The d attributes of the series paths. */
export function seriesPaths(svg: string): string[] {
  const out: string[] = [];
  const re = /<path class="series"[^>]*? d="([^"]*)"/g;
  for (let m = re.exec(svg); m; m = re.exec(svg)) out.push(m[1]);
  return out;
}

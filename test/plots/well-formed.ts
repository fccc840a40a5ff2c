/**
 * A small XML well-formedness check for the plots' SVG (no parser dependency):
 * every tag closes in order, attributes are quoted, and text holds no bare
 * "<" or "&" that is not an entity. Returns a description of the first
 * problem, or null when the text is well formed.
 */
export function xmlProblem(text: string): string | null {
  const stack: string[] = [];
  const tag = /<(\/?)([A-Za-z][\w:.-]*)((?:\s+[\w:.-]+="[^"<]*")*)\s*(\/?)>/y;
  let i = 0;
  let roots = 0;
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    const chunk = lt < 0 ? text.slice(i) : text.slice(i, lt);
    if (/&(?!(amp|lt|gt|quot|#39|#\d+);)/.test(chunk)) return `bare & in text near "${chunk.slice(0, 40)}"`;
    if (chunk.includes('>')) return `bare > in text near "${chunk.slice(0, 40)}"`;
    if (lt < 0) break;
    tag.lastIndex = lt;
    const m = tag.exec(text);
    if (!m) return `malformed tag at ${lt}: "${text.slice(lt, lt + 60)}"`;
    const [, close, name, attrs, selfClose] = m;
    if (/&(?!(amp|lt|gt|quot|#39|#\d+);)/.test(attrs)) return `bare & in attributes of <${name}>`;
    if (close) {
      const open = stack.pop();
      if (open !== name) return `</${name}> closes <${open}>`;
    } else if (!selfClose) {
      if (stack.length === 0) roots++;
      stack.push(name);
    } else if (stack.length === 0) roots++;
    i = tag.lastIndex;
  }
  if (stack.length) return `unclosed <${stack[stack.length - 1]}>`;
  if (roots !== 1) return `${roots} root elements`;
  return null;
}

/** Occurrences of a substring. */
export function count(text: string, needle: string): number {
  let n = 0;
  for (let i = text.indexOf(needle); i >= 0; i = text.indexOf(needle, i + needle.length)) n++;
  return n;
}

/** The numeric values of attribute `name` over every element with class `cls`. */
export function attrValues(svg: string, cls: string, name: string): number[] {
  const out: number[] = [];
  const re = new RegExp(`<[a-z]+ class="${cls}"[^>]*?\\s${name}="([^"]+)"`, 'g');
  for (let m = re.exec(svg); m; m = re.exec(svg)) out.push(Number(m[1]));
  return out;
}

/** The x (or y) pixel of each tick label on the x (y) axis, with its text, from the SVG. */
export function tickLabels(svg: string, axis: 'x' | 'y'): string[] {
  const re =
    axis === 'x'
      ? /<text x="[^"]+" y="[^"]+" text-anchor="middle" fill="#222222">([^<]*)<\/text>/g
      : /<text x="[^"]+" y="[^"]+" text-anchor="end" fill="#222222">([^<]*)<\/text>/g;
  const out: string[] = [];
  for (let m = re.exec(svg); m; m = re.exec(svg)) out.push(m[1]);
  return out;
}

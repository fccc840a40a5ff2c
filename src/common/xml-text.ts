/**
 * The XML text this add-in writes: the plots' SVG and the maps it keeps in the
 * workbook. One escaper for both, and reading back elements of our own simple
 * form. It never evaluates anything and reads only the elements and attributes
 * it wrote.
 */

/**
 * Characters XML 1.0 does not allow at all (section 2.2, Char): C0 controls
 * other than tab, LF and CR; U+FFFE and U+FFFF; and a surrogate code unit that
 * is not half of a pair.
 */
// eslint-disable-next-line no-control-regex
const NOT_XML = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/**
 * Escapes text for XML (or SVG) content or a quoted attribute: & < > " ' as
 * entities and, so attribute values survive normalisation, tab, LF and CR as
 * character references. Characters XML forbids become U+FFFD, so a reader sees
 * that something was there. null and undefined give "". O(length).
 * @example escapeXml('a<b & "c"') // 'a&lt;b &amp; &quot;c&quot;'
 */
export function escapeXml(text: unknown): string {
  return String(text ?? '')
    .replace(NOT_XML, '\uFFFD')
    .replace(/[&<>"'\t\n\r]/g, (c) => ESC[c]);
}

/**
 * Rewrites characters XML cannot hold as JSON \u escapes. In JSON text such
 * characters can only stand inside strings, where the escape means the same
 * character, so the result parses to the same value. O(length).
 * @example jsonSafeForXml('{"a":"\uFFFE"}') // '{"a":"\\ufffe"}'
 */
export function jsonSafeForXml(json: string): string {
  return json.replace(NOT_XML, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

const ESC: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;', '\t': '&#9;', '\n': '&#10;', '\r': '&#13;' };
const NAMED: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/**
 * Undoes XML escaping: the five named entities, decimal and hex character
 * references, and CDATA sections (in case a host rewrote the text that way).
 * Unknown entities are left as they are. O(length).
 * @example unescapeXmlText('a&lt;b &#38; &#x41;') // 'a<b & A'
 */
export function unescapeXmlText(s: string): string {
  const parts = s.split(/<!\[CDATA\[([\s\S]*?)\]\]>/);
  let out = '';
  for (let i = 0; i < parts.length; i++) {
    out +=
      i % 2 === 1
        ? parts[i]
        : parts[i].replace(/&(#x[0-9a-fA-F]+|#[0-9]+|[a-z]+);/g, (m, body: string) => {
            if (body[0] === '#') {
              const code = body[1] === 'x' ? parseInt(body.slice(2), 16) : parseInt(body.slice(1), 10);
              return code >= 0 && code <= 0x10ffff ? String.fromCodePoint(code) : m;
            }
            return NAMED[body] ?? m;
          });
  }
  return out;
}

/** One element read back: its attributes (unescaped) and its inner text or markup. */
export interface XmlElement {
  readonly attrs: Readonly<Record<string, string>>;
  readonly inner: string;
}

/**
 * Finds every element named `name` (any namespace prefix) in `xml`, with its
 * attributes and inner content, in document order. Meant for the flat XML this
 * add-in writes, where such elements do not nest in themselves. O(length).
 * @example xmlElements('<a x="1">t</a><a x="2"/>', 'a') // [{ attrs: { x: '1' }, inner: 't' }, { attrs: { x: '2' }, inner: '' }]
 */
export function xmlElements(xml: string, name: string): XmlElement[] {
  const out: XmlElement[] = [];
  const open = new RegExp(`<(?:[\\w.-]+:)?${name}(\\s[^>]*?)?(/?)>`, 'g');
  let m: RegExpExecArray | null;
  while ((m = open.exec(xml)) !== null) {
    const attrs = readAttrs(m[1] ?? '');
    if (m[2] === '/') {
      out.push({ attrs, inner: '' });
      continue;
    }
    const close = new RegExp(`</(?:[\\w.-]+:)?${name}\\s*>`, 'g');
    close.lastIndex = open.lastIndex;
    const c = close.exec(xml);
    if (!c) break;
    out.push({ attrs, inner: xml.slice(open.lastIndex, c.index) });
    open.lastIndex = close.lastIndex;
  }
  return out;
}

function readAttrs(text: string): Record<string, string> {
  const attrs: Record<string, string> = Object.create(null);
  const re = /([\w.:-]+)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text)) !== null) {
    const key = m[1].includes(':') && !m[1].startsWith('xmlns') ? m[1].slice(m[1].indexOf(':') + 1) : m[1];
    attrs[key] = unescapeXmlText(m[2] ?? m[3] ?? '');
  }
  return attrs;
}

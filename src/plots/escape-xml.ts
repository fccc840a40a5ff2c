/**
 * Escapes text for use inside SVG/XML text and attribute values: & < > " '
 * become entities, and characters XML 1.0 forbids (control characters other
 * than tab, newline and carriage return, lone surrogates) are dropped.
 * O(length).
 * @example escapeXml('A & B <2>') // 'A &amp; B &lt;2&gt;'
 */
export function escapeXml(text: unknown): string {
  const s = String(text ?? '');
  let out = '';
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c === 0x26) out += '&amp;';
    else if (c === 0x3c) out += '&lt;';
    else if (c === 0x3e) out += '&gt;';
    else if (c === 0x22) out += '&quot;';
    else if (c === 0x27) out += '&#39;';
    else if (c < 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0d) continue;
    else if (c === 0xfffe || c === 0xffff) continue;
    else if (c >= 0xd800 && c <= 0xdbff) {
      const next = s.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        out += s[i] + s[i + 1];
        i++;
      }
    } else if (c >= 0xdc00 && c <= 0xdfff) continue;
    else out += s[i];
  }
  return out;
}

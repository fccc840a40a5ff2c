import { escapeXml, jsonSafeForXml, unescapeXmlText, xmlElements } from '../../src/common/xml-text';

describe('the XML the store writes', () => {
  test('escaping and unescaping round-trip any text, including markup characters and line breaks', () => {
    const text = Object.freeze(['a<b & "c" \'d\'\n\tend', '{"k":[1,2]}', '']);
    for (const t of text) expect(unescapeXmlText(escapeXml(t))).toBe(t);
    // Source: XML 1.0, section 2.4 (the five predefined entities) and 4.1 (character references)
    expect(unescapeXmlText('&lt;&#38;&#x41;<![CDATA[<raw>]]>&unknown;')).toBe('<&A<raw>&unknown;');
  });

  test('characters XML forbids become JSON escapes that parse to the same value', () => {
    const json = JSON.stringify({ name: 'x\uFFFEy' });
    const safe = jsonSafeForXml(json);
    expect(safe).not.toMatch(/\uFFFE/);
    expect(JSON.parse(safe)).toEqual(JSON.parse(json));
  });

  test('xmlElements reads our elements with any namespace prefix, self-closing or not', () => {
    const xml =
      '<?xml version="1.0"?><ns0:maps xmlns:ns0="urn:x"><ns0:map handle="h&amp;1" cell=\'A1\'><ns0:part id="{1}"/><ns0:part id="{2}"/></ns0:map></ns0:maps>';
    const maps = xmlElements(xml, 'map');
    expect(maps).toHaveLength(1);
    expect(maps[0].attrs).toMatchObject({ handle: 'h&1', cell: 'A1' });
    expect(xmlElements(maps[0].inner, 'part').map((p) => p.attrs.id)).toEqual(['{1}', '{2}']);
  });
});

describe('escapeXml: one escaper for the plots and the workbook store', () => {
  test('turns the five XML special characters into entities', () => {
    // Source: XML 1.0 section 2.4 (predefined entities)
    expect(escapeXml(`a & b < c > d " e ' f`)).toBe('a &amp; b &lt; c &gt; d &quot; e &apos; f');
  });
  test('writes tab, newline and carriage return as character references, so attribute values keep them', () => {
    // Source: XML 1.0 section 3.3.3 (attribute-value normalisation turns literal white space into spaces)
    expect(escapeXml('a\tb\nc\rd')).toBe('a&#9;b&#10;c&#13;d');
  });
  test('replaces characters XML 1.0 forbids with U+FFFD and keeps non-ASCII text', () => {
    // Source: XML 1.0 section 2.2 (Char production); U+FFFD is Unicode's replacement character
    expect(escapeXml('a\u0000b\u0007c\uFFFEd')).toBe('a\uFFFDb\uFFFDc\uFFFDd');
    expect(escapeXml('Zürich – 東京 😀')).toBe('Zürich – 東京 😀');
  });
  test('replaces a lone surrogate, keeps a pair', () => {
    // Source: XML 1.0 section 2.2 (surrogate code units are not characters on their own)
    expect(escapeXml('a\ud800b')).toBe('a\uFFFDb');
    expect(escapeXml('b\udc00')).toBe('b\uFFFD');
    expect(escapeXml('\ud83d\ude00')).toBe('😀');
  });
  test('writes null and undefined as empty text and numbers as their text', () => {
    // Source: design choice
    expect(escapeXml(null)).toBe('');
    expect(escapeXml(undefined)).toBe('');
    expect(escapeXml(3.5)).toBe('3.5');
  });
  test('a lone surrogate in JSON becomes an escape that parses back to the same value', () => {
    // Source: ECMA-404 section 9 (\\u escapes of any code unit)
    const json = JSON.stringify({ name: 'x\ud800y' });
    expect(JSON.parse(jsonSafeForXml(json))).toEqual({ name: 'x\ud800y' });
    expect(jsonSafeForXml(json)).not.toMatch(/[\ud800-\udfff]/);
  });
});

import { escapeXmlText, jsonSafeForXml, unescapeXmlText, xmlElements } from '../../src/workbook/xml-text';

describe('the XML the store writes', () => {
  test('escaping and unescaping round-trip any text, including markup characters and line breaks', () => {
    const text = Object.freeze(['a<b & "c" \'d\'\n\tend', '{"k":[1,2]}', '']);
    for (const t of text) expect(unescapeXmlText(escapeXmlText(t))).toBe(t);
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
    const xml = '<?xml version="1.0"?><ns0:maps xmlns:ns0="urn:x"><ns0:map handle="h&amp;1" cell=\'A1\'><ns0:part id="{1}"/><ns0:part id="{2}"/></ns0:map></ns0:maps>';
    const maps = xmlElements(xml, 'map');
    expect(maps).toHaveLength(1);
    expect(maps[0].attrs).toMatchObject({ handle: 'h&1', cell: 'A1' });
    expect(xmlElements(maps[0].inner, 'part').map((p) => p.attrs.id)).toEqual(['{1}', '{2}']);
  });
});

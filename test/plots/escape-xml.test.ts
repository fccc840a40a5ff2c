import { escapeXml } from '../../src/plots/escape-xml';

describe('escapeXml', () => {
  test('escapeXml(text) turns the five XML special characters into entities', () => {
    // Source: XML 1.0 section 2.4 (predefined entities)
    expect(escapeXml(`a & b < c > d " e ' f`)).toBe('a &amp; b &lt; c &gt; d &quot; e &#39; f');
  });
  test('drops control characters XML 1.0 forbids but keeps tab, newline and non-ASCII text', () => {
    // Source: XML 1.0 section 2.2 (Char production)
    expect(escapeXml('a\u0000b\u0007c\td\ne')).toBe('abc\td\ne');
    expect(escapeXml('Zürich – 東京 😀')).toBe('Zürich – 東京 😀');
  });
  test('drops a lone surrogate', () => {
    // Source: XML 1.0 section 2.2 (surrogates are not characters)
    expect(escapeXml('a\ud800b')).toBe('ab');
  });
  test('writes null and undefined as empty text and numbers as their text', () => {
    // Source: common practice
    expect(escapeXml(null)).toBe('');
    expect(escapeXml(undefined)).toBe('');
    expect(escapeXml(3.5)).toBe('3.5');
  });
});

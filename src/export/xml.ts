/**
 * Writing user text into XML (SVG, TEI): every export goes through these, so a label or a
 * title holding `<script>` or `]]>` stays text. XML 1.0 (W3C Recommendation, 5th ed.):
 * `&`, `<`, `>` escaped in text, and the quote too in attributes; characters XML 1.0 does
 * not allow (most C0 controls, lone surrogates, U+FFFE/U+FFFF) are dropped.
 */

// XML 1.0 §2.2 Char: #x9 | #xA | #xD | [#x20-#xD7FF] | [#xE000-#xFFFD] | [#x10000-#x10FFFF].
const NOT_XML_CHAR = /[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu;

/** Text content: safe between tags. */
export function xmlText(s: string): string {
  return s.replace(NOT_XML_CHAR, '').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** An attribute value, to be written inside double quotes. */
export function xmlAttr(s: string): string {
  return xmlText(s).replace(/"/g, '&quot;').replace(/\t/g, '&#9;').replace(/\n/g, '&#10;').replace(/\r/g, '&#13;');
}

/** A number for coordinates: at most `digits` decimals, no trailing zeros, no '-0'. */
export function num(v: number, digits = 3): string {
  const s = v.toFixed(digits).replace(/\.?0+$/, '');
  return s === '-0' ? '0' : s;
}

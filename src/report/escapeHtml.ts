// Escaping for the three places text goes into the page: HTML text/attributes, JSON data blocks, inline scripts.

const HTML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/**
 * Escapes & < > " ' so that any text is shown as text in HTML element content and in quoted attribute
 * values (OWASP XSS Prevention Cheat Sheet, rule #1 and #2 for quoted attributes).
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (ch) => HTML_ESCAPES[ch]);
}

/** The characters jsonForScriptBlock escapes, one pass over the JSON text for all of them. */
const SCRIPT_BLOCK_ESCAPES: Record<string, string> = { '<': '\\u003c', '>': '\\u003e', '&': '\\u0026', '\u2028': '\\u2028', '\u2029': '\\u2029' };

/**
 * JSON for a `<script type="application/json">` block: `<`, `>` and `&` written as \u003c, \u003e,
 * \u0026 so no `</script>` or `<!--` can appear (HTML Living Standard §4.12.1.3, restrictions for
 * contents of script elements); U+2028/U+2029 escaped too. JSON.parse of the block gives the value back.
 */
export function jsonForScriptBlock(value: unknown): string {
  return JSON.stringify(value).replace(/[<>&\u2028\u2029]/g, (ch) => SCRIPT_BLOCK_ESCAPES[ch]);
}

/**
 * Makes JavaScript source safe to inline in a classic `<script>`: every `<!--`, `<script` and
 * `</script` (any case) gets its `<` written as the escape \x3C, which is the same character inside
 * string and template literals and matches the same in regular expressions (only a regexp's .source
 * text changes), the only places such text can occur in valid code (HTML Living Standard §4.12.1.3). Such text outside a literal cannot occur in valid code; the
 * browser tests are the check that the inlined libraries still run.
 */
export function inlineScriptSource(js: string): string {
  return js.replace(/<(?=!--|\/?script)/gi, '\\x3C');
}

import { describe, expect, it } from 'vitest';
import { escapeHtml, inlineScriptSource, jsonForScriptBlock } from '../../src/report/escapeHtml.js';

describe('escapeHtml', () => {
  // Source: OWASP XSS Prevention Cheat Sheet, rule #1 (the five characters and their entities).
  it('replaces exactly & < > " \' with their entities and leaves other text alone', () => {
    expect(escapeHtml(`&<>"'`)).toBe('&amp;&lt;&gt;&quot;&#39;');
    expect(escapeHtml('Fenbird 2 · 090° ±5')).toBe('Fenbird 2 · 090° ±5');
  });

  it('escapes each character once (an entity in the input is shown as typed)', () => {
    expect(escapeHtml('&amp;')).toBe('&amp;amp;');
  });
});

describe('jsonForScriptBlock', () => {
  const nasty = { name: '</script><script>alert(1)</script>', c: '<!-- x -->', amp: 'a & b', ls: 'line\u2028sep\u2029' };

  // Source: HTML Living Standard §4.12.1.3: a script block must not contain "</script" or "<!--".
  it('writes no < > & or raw U+2028/U+2029, so the block cannot be closed from inside', () => {
    const j = jsonForScriptBlock(nasty);
    expect(j).not.toMatch(/[<>&\u2028\u2029]/);
  });

  // Oracle: JSON.parse (ECMA-404 \u escapes) gives the original value back.
  it('parses back to the same value', () => {
    expect(JSON.parse(jsonForScriptBlock(nasty))).toEqual(nasty);
  });
});

describe('inlineScriptSource', () => {
  it('rewrites <!--, <script and </script in any case so an inline script cannot end early', () => {
    const out = inlineScriptSource('var a="</SCRIPT>", b=/<script>/, c=`<!--`;');
    expect(out).not.toMatch(/<\/?script|<!--/i);
  });

  // Oracle: the JavaScript engine itself: rewritten strings, templates and regexp matches evaluate as before
  // (a regexp's .source text does change, which is why only matching is promised).
  it('keeps the meaning of string, template and regular-expression literals', () => {
    const src = 'return ["</script>", `<!-- x`, /<script>/.test("a<script>"), /<SCRIPT/i.exec("x<script")[0]]';
    const before = new Function(src)();
    const after = new Function(inlineScriptSource(src))();
    expect(after).toEqual(before);
  });
});

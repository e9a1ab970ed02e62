// XML events for the log readers: a document's start tags, text and end tags, from saxes (any document, with
// its well-formedness errors) or from a fast scanner of plain documents (the usual track log), which gives the
// very same events and answers "not plain" for anything else, so that the reader then asks saxes.
//
// Source: Extensible Markup Language (XML) 1.0, W3C Recommendation, 5th edition (2008). The plain subset read
// here, every part of it well-formed XML by that text, and the events as saxes gives them:
// - an optional XML declaration at the very start, version 1.0, with encoding and standalone (§2.8);
// - one root element, with only white space (§2.3, S) before and after it;
// - start tags, empty-element tags and end tags (§3.1) whose names are ASCII NameStartChar/NameChar
//   [A-Za-z_:][A-Za-z0-9._:-]* (§2.3), attributes separated by white space, each name once, values in
//   quotes without '<', '&', tab, CR or LF (so attribute-value normalisation (§3.3.3) has nothing to do);
// - character data without '&', '<' or '>' (so no reference and no "]]>", §2.4), of Chars (§2.2) below
//   U+D800 or from U+E000 to U+FFFD; line ends CR LF or LF (§2.11: CR LF is passed on as LF);
// - comments (§2.5) of the same characters, anywhere outside a tag (they give no event).
// Anything else (processing instructions, CDATA, DOCTYPE, references, lone CR, non-ASCII names, a
// second root, an unclosed element, any error) makes the scanner stop and answer false.
import type { SaxesTagPlain } from 'saxes';
import { requireCjs } from '../util/requireCjs.js';

const { SaxesParser } = requireCjs('saxes') as typeof import('saxes');

/** What a reader does with the events. Lines are 1-based, counted as saxes counts them. */
export interface XmlHandlers {
  /** A start tag's name has been read; `line` is that of its '<' (a name never spans lines). */
  openStart(line: number): void;
  /** A start tag (or empty-element tag) is complete: its attributes' names and values, in document order. */
  open(name: string, attrNames: readonly string[], attrValues: readonly string[]): void;
  /** Character data inside the root (maybe in several pieces; CDATA sections too). */
  text(chunk: string): void;
  /** An end tag, or the end of an empty-element tag; `line` is that of its '>'. */
  close(name: string, line: number): void;
}

/** The value of attribute `name` among those of an `open` event; undefined when the tag has none of that name. */
export function attributeValue(names: readonly string[], values: readonly string[], name: string): string | undefined {
  for (let j = 0; j < names.length; j++) if (names[j] === name) return values[j];
  return undefined;
}

/** The first well-formedness error of a document: saxes's message without its position, its line, and whether it came at the end of the text. */
export interface XmlStop {
  message: string;
  line: number;
  atEnd: boolean;
}

/** Thrown from the saxes error handler to stop at the first well-formedness error. */
class StopAtXmlError extends Error {}

function stripPosition(message: string): string {
  // saxes prefixes "line:column: " to its messages.
  return message.replace(/^(?:[^:]*:)?\d+:\d+:\s*/, '');
}

/**
 * Reads `text` with saxes (namespaces not processed), calling `h` for each event, and stops at the first
 * well-formedness error (XML 1.0 §1.2: after a fatal error the processor "MUST NOT continue normal processing").
 * An exception thrown by a handler goes through.
 * @returns the error, or undefined for a well-formed document
 */
export function saxesXmlEvents(text: string, h: XmlHandlers): XmlStop | undefined {
  const parser = new SaxesParser({ xmlns: false, position: true });
  let stop: XmlStop | undefined;
  let atEnd = false;
  parser.on('error', (err) => {
    if (!stop) stop = { message: stripPosition(err.message), line: parser.line, atEnd };
    throw new StopAtXmlError();
  });
  let depth = 0; // saxes also reports the white space around the root as text: that is not passed on
  // saxes reports the tag once it has read the character after the name, counted already: where that was a
  // line end, the column is back at 0 and the tag began on the line before.
  parser.on('opentagstart', () => h.openStart(parser.column === 0 ? parser.line - 1 : parser.line));
  parser.on('opentag', (tag: SaxesTagPlain) => {
    depth++;
    const attributes = tag.attributes as Record<string, string>;
    h.open(tag.name, Object.keys(attributes), Object.values(attributes));
  });
  const onText = (chunk: string) => {
    if (depth > 0) h.text(chunk);
  };
  parser.on('text', onText);
  parser.on('cdata', onText);
  parser.on('closetag', (tag: SaxesTagPlain) => {
    depth--;
    h.close(tag.name, parser.line);
  });
  try {
    parser.write(text);
    atEnd = true;
    parser.close();
  } catch (err) {
    if (!(err instanceof StopAtXmlError)) throw err;
  }
  return stop;
}

const LT = 60, GT = 62, AMP = 38, SLASH = 47, EQ = 61, QUOT = 34, APOS = 39, QMARK = 63, BANG = 33;
const SP = 32, TAB = 9, LF = 10, CR = 13;

const XML_DECL = /^<\?xml[ \t\r\n]+version[ \t\r\n]*=[ \t\r\n]*(["'])1\.0\1(?:[ \t\r\n]+encoding[ \t\r\n]*=[ \t\r\n]*(["'])[A-Za-z][A-Za-z0-9._-]*\2)?(?:[ \t\r\n]+standalone[ \t\r\n]*=[ \t\r\n]*(["'])(?:yes|no)\3)?[ \t\r\n]*\?>/;

function isSpace(c: number): boolean {
  return c === SP || c === LF || c === TAB || c === CR;
}
function isNameStart(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 65 && c <= 90) || c === 95 || c === 58;
}
function isNameChar(c: number): boolean {
  return isNameStart(c) || (c >= 48 && c <= 57) || c === 46 || c === 45;
}
/** A Char of character data or an attribute value here: tab, LF, CR (checked apart), U+0020–U+D7FF, U+E000–U+FFFD. */
function isPlainChar(c: number): boolean {
  return c >= SP ? c < 0xd800 || (c >= 0xe000 && c <= 0xfffd) : c === LF || c === TAB || c === CR;
}

/**
 * The events of `text` when it is a plain document (see the file header), the same as saxesXmlEvents gives;
 * false, after some events perhaps, as soon as it is not, and then the reader starts again with saxes.
 * An exception thrown by a handler goes through.
 */
export function plainXmlEvents(text: string, h: XmlHandlers): boolean {
  const n = text.length;
  // A CR is only taken before an LF (then the pair counts as one line end, as LF).
  for (let k = text.indexOf('\r'); k >= 0; k = text.indexOf('\r', k + 1)) if (text.charCodeAt(k + 1) !== LF) return false;
  let i = 0;
  let line = 1;
  if (text.startsWith('<?')) {
    const m = XML_DECL.exec(text);
    if (m === null) return false;
    for (let k = 0; k < m[0].length; k++) if (text.charCodeAt(k) === LF) line++;
    i = m[0].length;
  }
  const stack: string[] = [];
  let rootClosed = false;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c !== LT) {
      // Character data up to the next '<'.
      const start = i;
      let crlf = false;
      for (; i < n; i++) {
        const d = text.charCodeAt(i);
        if (d === LT) break;
        if (d === AMP || d === GT || !isPlainChar(d)) return false;
        if (d === LF) line++;
        else if (d === CR) crlf = true;
      }
      if (stack.length === 0) {
        // Outside the root only white space may stand.
        for (let k = start; k < i; k++) if (!isSpace(text.charCodeAt(k))) return false;
        continue;
      }
      const chunk = text.slice(start, i);
      h.text(crlf ? chunk.replace(/\r\n/g, '\n') : chunk);
      continue;
    }
    const c1 = text.charCodeAt(i + 1);
    if (c1 === SLASH) {
      // End tag: '</' Name S? '>', the name of the open element.
      let k = i + 2;
      if (!isNameStart(text.charCodeAt(k))) return false;
      while (k < n && isNameChar(text.charCodeAt(k))) k++;
      const name = text.slice(i + 2, k);
      for (; k < n && isSpace(text.charCodeAt(k)); k++) if (text.charCodeAt(k) === LF) line++;
      if (text.charCodeAt(k) !== GT || stack.length === 0 || stack[stack.length - 1] !== name) return false;
      stack.pop();
      h.close(name, line);
      if (stack.length === 0) rootClosed = true;
      i = k + 1;
      continue;
    }
    if (c1 === BANG && text.startsWith('<!--', i)) {
      // Comment (§2.5): '<!--' ((Char - '-') | ('-' (Char - '-')))* '-->'; no event, only its lines.
      const end = text.indexOf('--', i + 4);
      if (end < 0 || text.charCodeAt(end + 2) !== GT) return false;
      for (let k = i + 4; k < end; k++) {
        const d = text.charCodeAt(k);
        if (!isPlainChar(d)) return false;
        if (d === LF) line++;
      }
      i = end + 3;
      continue;
    }
    if (c1 === BANG || c1 === QMARK || rootClosed) return false;
    // Start tag: '<' Name (S Attribute)* S? ('>' | '/>').
    let k = i + 1;
    if (!isNameStart(text.charCodeAt(k))) return false;
    while (k < n && isNameChar(text.charCodeAt(k))) k++;
    const name = text.slice(i + 1, k);
    if (k >= n) return false;
    h.openStart(line);
    const names: string[] = [];
    const values: string[] = [];
    let empty = false;
    for (;;) {
      let spaced = false;
      for (; k < n && isSpace(text.charCodeAt(k)); k++) {
        spaced = true;
        if (text.charCodeAt(k) === LF) line++;
      }
      if (k >= n) return false;
      const d = text.charCodeAt(k);
      if (d === GT) { k++; break; }
      if (d === SLASH) {
        if (text.charCodeAt(k + 1) !== GT) return false;
        empty = true;
        k += 2;
        break;
      }
      if (!spaced || !isNameStart(d)) return false;
      const a0 = k;
      while (k < n && isNameChar(text.charCodeAt(k))) k++;
      const aName = text.slice(a0, k);
      for (; k < n && isSpace(text.charCodeAt(k)); k++) if (text.charCodeAt(k) === LF) line++;
      if (text.charCodeAt(k) !== EQ) return false;
      for (k++; k < n && isSpace(text.charCodeAt(k)); k++) if (text.charCodeAt(k) === LF) line++;
      const q = text.charCodeAt(k);
      if (q !== QUOT && q !== APOS) return false;
      const v0 = ++k;
      for (; k < n; k++) {
        const e = text.charCodeAt(k);
        if (e === q) break;
        if (e === LT || e === AMP || e === TAB || e === LF || e === CR || !isPlainChar(e)) return false;
      }
      if (k >= n || names.includes(aName)) return false;
      names.push(aName);
      values.push(text.slice(v0, k));
      k++;
    }
    stack.push(name);
    h.open(name, names, values);
    if (empty) {
      stack.pop();
      h.close(name, line);
      if (stack.length === 0) rootClosed = true;
    }
    i = k;
  }
  return rootClosed && stack.length === 0;
}

/** One reading of a document: the handlers of its events, and what it makes of them at the end (given the first well-formedness error, if any). */
export interface XmlReading<T> {
  handlers: XmlHandlers;
  finish(stop: XmlStop | undefined): T;
}

/**
 * Reads `text` (a leading byte-order mark dropped) with a fresh reading from `newReading`: by the plain
 * scanner where the document is plain (the usual track log), else from the start again, with another
 * fresh reading, by saxes. Both give the same events, so the result is the same either way.
 */
export function readXml<T>(text: string, newReading: () => XmlReading<T>): T {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const plain = newReading();
  if (plainXmlEvents(body, plain.handlers)) return plain.finish(undefined);
  const full = newReading();
  return full.finish(saxesXmlEvents(body, full.handlers));
}

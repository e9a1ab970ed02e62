// Strict decimal numbers from text fields: an empty or malformed field is NaN, never 0.
import { COMMA, POINT, asciiScratch, parsePlainDecimalBytes } from './asciiFields.js';

const DECIMAL = /^\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*$/;
const DECIMAL_COMMA = /^\s*[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?\s*$/;

/**
 * Parses a plain decimal number (`12`, `-0.5`, `.5`, `1e3`). Empty text, hex, `Infinity`, thousands
 * separators and trailing junk give NaN (unlike `Number('')`, which is 0).
 */
export function parseDecimal(text: string | undefined): number {
  if (text === undefined) return NaN;
  const bytes = asciiScratch(text);
  const plain = bytes ? parsePlainDecimalBytes(bytes, 0, text.length, POINT) : NaN;
  if (plain === plain) return plain;
  if (!DECIMAL.test(text)) return NaN;
  return Number(text);
}

/** Same with a decimal comma (`12,5`), as written in many European locales. A point is then not accepted. */
export function parseDecimalComma(text: string | undefined): number {
  if (text === undefined) return NaN;
  const bytes = asciiScratch(text);
  const plain = bytes ? parsePlainDecimalBytes(bytes, 0, text.length, COMMA) : NaN;
  if (plain === plain) return plain;
  if (!DECIMAL_COMMA.test(text)) return NaN;
  return Number(text.replace(',', '.'));
}

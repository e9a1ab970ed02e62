// Strict decimal numbers from text fields: an empty or malformed field is NaN, never 0.

const DECIMAL = /^\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*$/;
const DECIMAL_COMMA = /^\s*[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?\s*$/;

/** Powers of ten that are exact doubles (10^0 … 10^22). */
const EXACT_POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * The plain form `[+-]digits[.digits]` with at most 15 digits, read by character codes: the string twin of
 * parsePlainDecimalBytes (asciiFields.ts), the same exact fast path (Clinger 1990), equal to Number().
 * NaN for anything else; the regular expression then decides.
 */
function parsePlainDecimal(text: string, pointCode: number): number {
  const end = text.length;
  let i = 0;
  let negative = false;
  let c = text.charCodeAt(0);
  if (c === 45 /* - */ || c === 43 /* + */) {
    negative = c === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fractionDigits = -1;
  for (; i < end; i++) {
    c = text.charCodeAt(i) - 48;
    if (c >= 0 && c <= 9) {
      mantissa = mantissa * 10 + c;
      digits++;
      if (fractionDigits >= 0) fractionDigits++;
    } else if (c === pointCode - 48 && fractionDigits < 0) {
      fractionDigits = 0;
    } else {
      return NaN;
    }
  }
  if (digits === 0 || digits > 15) return NaN;
  const v = fractionDigits > 0 ? mantissa / EXACT_POW10[fractionDigits] : mantissa;
  return negative ? -v : v;
}

/**
 * Parses a plain decimal number (`12`, `-0.5`, `.5`, `1e3`). Empty text, hex, `Infinity`, thousands
 * separators and trailing junk give NaN (unlike `Number('')`, which is 0).
 */
export function parseDecimal(text: string | undefined): number {
  if (text === undefined) return NaN;
  const plain = parsePlainDecimal(text, 46 /* . */);
  if (plain === plain) return plain;
  if (!DECIMAL.test(text)) return NaN;
  return Number(text);
}

/** Same with a decimal comma (`12,5`), as written in many European locales. A point is then not accepted. */
export function parseDecimalComma(text: string | undefined): number {
  if (text === undefined) return NaN;
  const plain = parsePlainDecimal(text, 44 /* , */);
  if (plain === plain) return plain;
  if (!DECIMAL_COMMA.test(text)) return NaN;
  return Number(text.replace(',', '.'));
}

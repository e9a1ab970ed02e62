// Text fields (names, descriptions) reduced to plain, bounded text: never markup.

/** Longest text kept for a name or comment, in characters. */
export const MAX_META_CHARS = 500;

/**
 * Reduces a free-text field to plain text: removes anything that looks like a markup tag (descriptions
 * are often HTML inside CDATA), decodes nothing further, collapses white space and caps the length.
 * The result still needs escaping before it is placed in HTML.
 */
export function toPlainText(text: string): string | undefined {
  const plain = text
    .replace(/<[^>]*>/g, ' ')
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g, '')
    .replace(/\s+/g, ' ')
    .trim();
  if (plain.length === 0) return undefined;
  return plain.length > MAX_META_CHARS ? `${plain.slice(0, MAX_META_CHARS - 1)}…` : plain;
}

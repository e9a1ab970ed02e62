// Small builders for the page's HTML fragments. Every text argument is escaped here, nowhere else.
import { escapeHtml } from '../escapeHtml.js';

/** A table cell of text; `cls` is a fixed class name from our own code, never log text. */
export function td(text: string, cls = ''): string {
  return cls === '' ? `<td>${escapeHtml(text)}</td>` : `<td class="${cls}">${escapeHtml(text)}</td>`;
}

/** A header row from column titles (and an optional unit line under each title). */
export function headRow(cols: readonly (readonly [string, string?])[]): string {
  const ths = cols.map(([title, unit]) => `<th scope="col">${escapeHtml(title)}${unit !== undefined && unit !== '' ? `<span class="unit">${escapeHtml(unit)}</span>` : ''}</th>`);
  return `<tr>${ths.join('')}</tr>`;
}

/**
 * A table row that moves the page's cursor to tUtc when clicked or activated by keyboard;
 * t0/t1 set the zoom of the timeline. Times are numbers, so they need no escaping beyond String().
 */
export function jumpRow(cells: string[], tUtc: number, t0Utc: number, t1Utc: number, label: string): string {
  const attr = (x: number) => (Number.isFinite(x) ? String(Math.round(x * 10) / 10) : '');
  return `<tr class="jump" tabindex="0" data-t="${attr(tUtc)}" data-t0="${attr(t0Utc)}" data-t1="${attr(t1Utc)}" title="${escapeHtml(`Show ${label} on the charts and the card`)}">${cells.join('')}</tr>`;
}

/** A definition-list entry; value is text. */
export function fact(term: string, value: string): string {
  return `<div class="fact"><dt>${escapeHtml(term)}</dt><dd>${escapeHtml(value)}</dd></div>`;
}

/** A table, or the empty-state sentence when there are no rows. */
export function tableOrEmpty(id: string, caption: string, head: string, rows: string[], empty: string): string {
  if (rows.length === 0) return `<p class="empty" id="${id}-empty">${escapeHtml(empty)}</p>`;
  return `<p class="table-caption" id="${id}-caption">${escapeHtml(caption)}</p><div class="table-wrap"><table id="${id}" aria-describedby="${id}-caption"><thead>${head}</thead><tbody>${rows.join('')}</tbody></table></div>`;
}

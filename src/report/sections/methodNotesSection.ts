// Section 7, "Method, cautions and terms": how the numbers were made, what they are not for, a glossary.
import type { ReportModel } from '../reportModelTypes.js';
import { escapeHtml } from '../escapeHtml.js';
import { fmtCount, fmtNumber } from '../pilotFormat.js';

/** The cautions, word for word the same wherever the tool prints them. */
export const CAUTION_TEXT =
  'This report is a debrief aid. It is not for navigation or airworthiness decisions. The aircraft’s flight manual, the instructor, local regulations and licensed maintenance practice govern.';

/** Trade terms used on the page, in our own words. Sources where a definition rests on one. */
const GLOSSARY: readonly [string, string][] = [
  ['Variation', 'The angle between true north and magnetic north at a place (also called declination). East is positive: magnetic heading + variation = true heading. Taken here from the World Magnetic Model.'],
  ['Deviation', 'The compass’s own error caused by the aircraft’s magnetism, as written on the deviation card. Easterly is positive here: compass + deviation = magnetic. Some maintenance forms print the opposite sign.'],
  ['Dip', 'The angle by which the Earth’s field points below the horizontal (inclination), down positive. It grows toward the magnetic poles, and it is the reason a tilted card reads wrong.'],
  ['Lubber line', 'The fixed mark on the compass window, in line with the aircraft’s nose, against which the card is read.'],
  ['Turning error', 'In a turn the pendulous card tilts with the apparent gravity and the vertical part of the field pulls it round. In the northern hemisphere the card lags when turning through north and leads when turning through south; the reverse in the southern hemisphere.'],
  ['Acceleration error', 'A speed change tilts the card fore and aft. On easterly and westerly headings in the northern hemisphere, accelerating shows an apparent turn toward north and decelerating toward south; none on north or south headings.'],
  ['Swirl', 'The liquid in the bowl is dragged round during a turn and drags the card with it, so the error grows and outlasts the turn a little.'],
  ['Standard-rate turn', 'A turn at 3° per second, 360° in two minutes (FAA Instrument Flying Handbook, FAA-H-8083-15B, ch. 7).'],
  ['Static reading', 'Where the card would settle if the flight condition of that instant were held; the simulated reading adds the card’s lag, swing and swirl.'],
  ['Divergence window', 'Our name for a span where the simulated compass stayed away from the magnetic heading by more than a threshold for long enough to matter.'],
];

/** HTML of the method-and-cautions section's body. */
export function methodNotesSection(m: ReportModel): string {
  const g = m.glance;
  const d = m.downsample;
  const method = [
    'The compass reading is simulated, not recorded. The log’s positions are smoothed, the ground velocity and acceleration follow from them, the wind (see “Wind used”) turns ground track into heading, and bank comes from the log or, where it has none, from a coordinated turn.',
    `The Earth’s field along the path comes from ${g.fieldModel} for epoch ${fmtNumber(g.decimalYear, 2)}. Local magnetic anomalies and the aircraft’s own magnetism beyond a given deviation card are not known to the model.`,
    'The card is modelled as a pendulous magnet in liquid: its “down” follows the apparent gravity, its magnet seeks the part of the field in the card’s plane, and the card swings, lags and is dragged by the liquid with the time constants of the compass profile used.',
    'Compass error = compass reading − magnetic heading, in degrees. Positive: the card shows a larger number than the aircraft’s magnetic heading. Samples where the card is on its tilt stop or has lost its directive force are flagged unreliable and shaded grey on the error chart.',
    `Charts: ${d.drawn === d.samples ? `every sample is drawn (${fmtCount(d.samples)}).` : `${fmtCount(d.drawn)} of ${fmtCount(d.samples)} samples are drawn (${d.method}). The compass card and the slider step through the drawn points. The samples CSV has every sample.`}`,
    'All times are UTC. Headings are in degrees, speeds in knots, altitudes in feet, distances in nautical miles.',
  ];
  return `<div class="caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION_TEXT)}</div>
<h3>How the numbers were made</h3>
${method.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
<p class="quiet">Colours follow the palette of Okabe and Ito (“Color Universal Design”, 2008), chosen to stay distinguishable with the common forms of colour-vision deficiency; every line also has its own dash style and label.</p>
<h3>Terms</h3>
<dl class="glossary">${GLOSSARY.map(([t, v]) => `<dt>${escapeHtml(t)}</dt><dd>${escapeHtml(v)}</dd>`).join('')}</dl>`;
}

// Section 5, "Turns, speed changes, divergences": one table each, every row a link to its moment.
import type { ReportModel } from '../reportModelTypes.js';
import { fmtDuration, fmtHeading, fmtNumber, fmtSignedDeg, fmtUtcTime } from '../pilotFormat.js';
import { fmtBank } from './glanceSection.js';
import { headRow, jumpRow, tableOrEmpty, td } from './htmlParts.js';

const NOT_YET = 'either the flight had none, or this version of compass-debrief does not detect them yet.';

/** "+3° ✓ within 5°" / "−12° ✗ outside 5°": the grade in words and symbol, not colour alone. */
function grade(diffDeg: number, ok: boolean | null, toleranceDeg: number): string {
  if (!Number.isFinite(diffDeg)) return '–';
  const tol = Number.isFinite(toleranceDeg) ? ` ${fmtNumber(toleranceDeg, 0, '°')}` : ' tolerance';
  if (ok === null) return fmtSignedDeg(diffDeg, 0);
  return `${fmtSignedDeg(diffDeg, 0)} ${ok ? `✓ within${tol}` : `✗ outside${tol}`}`;
}

/** HTML of the turn table (what the compass showed at roll-out, where the roll-out should have begun). */
export function turnsTable(m: ReportModel): string {
  const head = headRow([
    ['Turn'],
    ['Start', 'UTC'],
    ['Turned'],
    ['Rate', '°/s'],
    ['Peak bank'],
    ['Entry → target', 'magnetic'],
    ['Rolled out on', 'magnetic, off target'],
    ['Roll-out began', 'at compass'],
    ['Should have begun', 'at compass (model)'],
    ['Rule of thumb', 'at compass'],
    ['Compass at roll-out', '→ once settled'],
    ['Timed turn'],
  ]);
  const rows = m.turns.map((t) => {
    const timed = Number.isFinite(t.timedDurationS)
      ? `${fmtDuration(t.timedDurationS)} for ${fmtNumber(t.timedExpectedChangeDeg, 0, '°')}${
          Number.isFinite(t.timedActualChangeDeg) ? `, flew ${fmtNumber(t.timedActualChangeDeg, 0, '°')} (${grade(t.timedDifferenceDeg, t.timedWithinTolerance, t.toleranceDeg)})` : ''
        }`
      : '–';
    return jumpRow(
      [
        td(t.label),
        td(fmtUtcTime(t.startUtc)),
        td(`${t.direction} ${fmtNumber(t.headingChangeDeg, 0, '°')}`),
        td(fmtNumber(t.meanRateDps, 1), 'num'),
        td(fmtBank(t.peakBankDeg), 'num'),
        td(`${fmtHeading(t.entryMagDeg)} → ${fmtHeading(t.targetMagDeg)}${t.targetSource === 'inferred' ? ' (inferred)' : ' (plan)'}`),
        td(`${fmtHeading(t.rolloutMagDeg)}, ${grade(t.rolloutErrorDeg, t.withinTolerance, t.toleranceDeg)}`, t.withinTolerance ? 'ok' : 'bad'),
        td(fmtHeading(t.compassAtRolloutStartDeg), 'num'),
        td(fmtHeading(t.cueCompassDeg), 'num'),
        td(fmtHeading(t.ruleOfThumbCueDeg), 'num'),
        td(`${fmtHeading(t.compassAtRolloutDeg)} → ${fmtHeading(t.compassSettledDeg)}`, 'num'),
        td(timed, 'wrap'),
      ],
      t.endUtc,
      t.startUtc,
      t.endUtc,
      `turn ${t.label}`,
    );
  });
  return tableOrEmpty(
    'turns-table',
    'Turns: the magnetic heading the aircraft rolled out on, the compass reading at which the roll-out began and at which it should have begun, and what the card showed as the wings came level. Click a row to see its roll-out.',
    head,
    rows,
    `No turns to list: ${NOT_YET}`,
  );
}

/** HTML of the speed-change table (acceleration error on straight legs). */
export function episodesTable(m: ReportModel): string {
  const head = headRow([['Episode'], ['Start', 'UTC'], ['Duration'], ['Kind'], ['Peak', 'kt/s'], ['Heading', 'magnetic'], ['Card swing'], ['Expected swing']]);
  const rows = m.episodes.map((e) =>
    jumpRow(
      [
        td(e.label),
        td(fmtUtcTime(e.startUtc)),
        td(fmtDuration(e.endUtc - e.startUtc)),
        td(e.kind),
        td(fmtNumber(e.peakAccelKtS, 1), 'num'),
        td(fmtHeading(e.headingMagDeg), 'num'),
        td(`${fmtNumber(Math.abs(e.peakSwingDeg), 0, '°')}${e.swingDirection === 'none' ? '' : ` to the ${e.swingDirection}`}`, 'num'),
        td(fmtNumber(e.expectedSwingDeg, 0, '°'), 'num'),
      ],
      e.startUtc,
      e.startUtc,
      e.endUtc,
      `speed change ${e.label}`,
    ),
  );
  return tableOrEmpty(
    'episodes-table',
    'Speed changes on straight legs and the apparent swing of the card they caused. Click a row to see it.',
    head,
    rows,
    `No speed-change episodes to list: ${NOT_YET}`,
  );
}

/** HTML of the divergence-window table (spans where the compass and the magnetic heading parted). */
export function divergencesTable(m: ReportModel): string {
  const head = headRow([['Window'], ['From', 'UTC'], ['To', 'UTC'], ['Length'], ['Peak error', 'compass − magnetic'], ['Peak at', 'UTC'], ['Main cause']]);
  const rows = m.divergences.map((d) =>
    jumpRow(
      [
        td(d.label),
        td(fmtUtcTime(d.startUtc)),
        td(fmtUtcTime(d.endUtc)),
        td(fmtDuration(d.endUtc - d.startUtc)),
        td(fmtSignedDeg(d.peakErrorDeg, 0), 'num'),
        td(fmtUtcTime(d.peakUtc)),
        td(d.cause),
      ],
      d.peakUtc,
      d.startUtc,
      d.endUtc,
      `divergence window ${d.label}`,
    ),
  );
  return tableOrEmpty(
    'divergences-table',
    'Divergence windows: where the compass stayed away from the magnetic heading for a while. They are shaded and labelled on the charts. Click a row to see its peak.',
    head,
    rows,
    `No divergence windows to list: ${NOT_YET}`,
  );
}

/** HTML of the legs flown on the compass (cross-track split into compass error, wind and the rest). */
export function excursionsTable(m: ReportModel): string {
  const head = headRow([['Leg'], ['From', 'UTC'], ['To', 'UTC'], ['Held on compass'], ['Off track', 'NM'], ['from compass error', 'NM'], ['from wind', 'NM'], ['rest', 'NM'], ['Found by']]);
  const rows = m.excursions.map((x) =>
    jumpRow(
      [
        td(x.label),
        td(fmtUtcTime(x.startUtc)),
        td(fmtUtcTime(x.endUtc)),
        td(fmtHeading(x.heldCompassDeg), 'num'),
        td(fmtNumber(x.observedCrossTrackNm, 2), 'num'),
        td(fmtNumber(x.compassCrossTrackNm, 2), 'num'),
        td(fmtNumber(x.windCrossTrackNm, 2), 'num'),
        td(fmtNumber(x.residualCrossTrackNm, 2), 'num'),
        td(x.source === 'option' ? 'given as an option' : 'detected'),
      ],
      x.endUtc,
      x.startUtc,
      x.endUtc,
      `compass leg ${x.label}`,
    ),
  );
  return tableOrEmpty(
    'excursions-table',
    'Legs flown on the compass: how far off track the aircraft ended (right +) and how much of that the compass error and the wind explain.',
    head,
    rows,
    `No legs flown on the compass to list: ${NOT_YET}`,
  );
}

/** HTML of section 5's body. */
export function eventTablesSection(m: ReportModel): string {
  return `<h3>Turns</h3>${turnsTable(m)}
<h3>Speed changes</h3>${episodesTable(m)}
<h3>Divergence windows</h3>${divergencesTable(m)}
<h3>Legs flown on the compass</h3>${excursionsTable(m)}`;
}

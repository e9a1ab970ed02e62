// `compass-debrief field <lat> <lon>`: WMM2025 variation, dip, intensities and zone at one place.
import { FT_M } from '../src/constants.js';
import { decimalYearOf, fieldAtPoint, isWithinWmm2025Validity, WMM2025_NAME } from '../src/magnetic/wmm2025.js';
import { zoneOfHorizontalIntensity, ZONE_BLACKOUT, ZONE_CAUTION } from '../src/magnetic/fieldAlongPath.js';
import { declinationUncertaintyDeg } from '../src/magnetic/declinationUncertainty.js';
import type { CliIo } from './cliIo.js';
import { parseCommandLine } from './parseCommandLine.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';

/** Negative numbers (south, west) are positionals, not options: move them behind `--` for parseArgs. */
function splitNumericPositionals(args: string[]): string[] {
  const opts: string[] = [];
  const nums: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (/^-\d/.test(a) && !(i > 0 && /^--(alt-ft|date)$/.test(args[i - 1]))) nums.push(a);
    else opts.push(a);
  }
  return nums.length > 0 ? [...opts, '--', ...nums] : opts;
}

function zoneName(zone: number): string {
  return zone === ZONE_BLACKOUT ? 'blackout' : zone === ZONE_CAUTION ? 'caution' : 'none';
}

export async function fieldCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseCommandLine('field', splitNumericPositionals(args), {
    'alt-ft': { type: 'string' },
    date: { type: 'string' },
    json: { type: 'boolean' },
  });
  if (values.help) {
    io.stdout(USAGE.field);
    return 0;
  }
  if (positionals.length !== 2) throw new UsageError('field', `expected latitude and longitude, got ${positionals.length} value(s)`);
  const latDeg = Number(positionals[0]);
  const lonDeg = Number(positionals[1]);
  if (!(Number.isFinite(latDeg) && Math.abs(latDeg) <= 90)) throw new UsageError('field', `latitude ${positionals[0]}: must be −90 to 90 decimal degrees`);
  if (!(Number.isFinite(lonDeg) && Math.abs(lonDeg) <= 180)) throw new UsageError('field', `longitude ${positionals[1]}: must be −180 to 180 decimal degrees`);
  const altFt = values['alt-ft'] !== undefined ? Number(values['alt-ft']) : 0;
  if (!(Number.isFinite(altFt) && altFt >= -3000 && altFt <= 2_700_000)) throw new UsageError('field', `--alt-ft ${values['alt-ft']}: must be −3000 to 2,700,000 ft`);
  let tMs = Date.now();
  if (values.date !== undefined) {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(values.date) || !Number.isFinite(Date.parse(`${values.date}T00:00:00Z`))) {
      throw new UsageError('field', `--date ${values.date}: expected YYYY-MM-DD`);
    }
    tMs = Date.parse(`${values.date}T00:00:00Z`);
  }
  const year = decimalYearOf(tMs / 1000);
  const f = fieldAtPoint(latDeg, lonDeg, altFt * FT_M, year);
  const zone = zoneName(zoneOfHorizontalIntensity(f.hNt));
  const valid = isWithinWmm2025Validity(year);
  const sigmaD = declinationUncertaintyDeg(f.hNt);
  if (values.json) {
    io.stdout(
      JSON.stringify(
        {
          model: WMM2025_NAME,
          decimal_year: Math.round(year * 1000) / 1000,
          lat_deg: latDeg,
          lon_deg: lonDeg,
          alt_ft: altFt,
          variation_deg: Math.round(f.variationDeg * 100) / 100,
          variation_sigma_deg: Math.round(sigmaD * 100) / 100,
          dip_deg: Math.round(f.dipDeg * 100) / 100,
          h_nt: Math.round(f.hNt),
          z_nt: Math.round(f.zNt),
          f_nt: Math.round(f.fNt),
          zone,
          within_model_validity: valid,
        },
        null,
        2,
      ) + '\n',
    );
    return 0;
  }
  const ew = f.variationDeg >= 0 ? 'E' : 'W';
  const lines = [
    `${WMM2025_NAME} at ${latDeg.toFixed(4)}, ${lonDeg.toFixed(4)}, ${altFt.toFixed(0)} ft, ${year.toFixed(2)}`,
    `  variation  ${Math.abs(f.variationDeg).toFixed(2)}° ${ew}  (east +: ${f.variationDeg.toFixed(2)}°; model 1-sigma about ${sigmaD.toFixed(2)}°)`,
    `  dip        ${f.dipDeg.toFixed(2)}°  (down +)`,
    `  horizontal ${Math.round(f.hNt)} nT   vertical ${Math.round(f.zNt)} nT   total ${Math.round(f.fNt)} nT`,
    `  zone       ${zone}${zone === 'none' ? '' : ' — weak horizontal field: the compass is unreliable or degraded here'}`,
  ];
  if (!valid) lines.push(`  note       ${year.toFixed(2)} lies outside the model's validity (2025.0 to 2030.0): values extrapolated`);
  io.stdout(lines.join('\n') + '\n');
  return 0;
}

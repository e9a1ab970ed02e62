// Test-side KML 2.2 writer: one Placemark with a gx:Track (when / gx:coord pairs), altitudeMode absolute.
import type { FlightLog } from '../../../src/log/flightLog.js';

export function writeKml(log: FlightLog): string {
  const when: string[] = [];
  const coord: string[] = [];
  for (let i = 0; i < log.t.length; i++) {
    when.push(`      <when>${new Date(Math.round(log.t[i] * 1000)).toISOString()}</when>`);
    coord.push(`      <gx:coord>${log.lon[i].toFixed(7)} ${log.lat[i].toFixed(7)} ${log.altM[i].toFixed(2)}</gx:coord>`);
  }
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<kml xmlns="http://www.opengis.net/kml/2.2" xmlns:gx="http://www.google.com/kml/ext/2.2">',
    '  <Document><name>Round trip</name><Placemark>',
    '    <gx:Track>',
    '      <altitudeMode>absolute</altitudeMode>',
    ...when,
    ...coord,
    '    </gx:Track>',
    '  </Placemark></Document>',
    '</kml>',
    '',
  ].join('\n');
}

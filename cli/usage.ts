// Usage texts for each command, with examples. Printed by --help and on a usage error.

export const USAGE: Record<string, string> = {
  main: `compass-debrief: what your magnetic compass showed during a recorded flight, and why.

Usage:
  compass-debrief report <log> [options]     analyse one flight log and write the debrief
  compass-debrief swing <swing.csv> [--json out.json]
                                             fit a deviation card to a compass-swing record
  compass-debrief field <lat> <lon> [--alt-ft N] [--date YYYY-MM-DD]
                                             World Magnetic Model 2025 at one place
  compass-debrief demo [--out-dir DIR]       write the debriefs of the bundled samples
  compass-debrief batch <folders or logs…> --out-dir DIR [--jobs N]
                                             debrief many flights: overview, catalogue, trends
  compass-debrief <command> --help           help on one command

Logs: GPX, CSV, IGC, NMEA 0183, FIT, KML (gx:Track); the format is told from the content.
Examples:
  compass-debrief report samples/circuit-practice.gpx --wind 250/15 --out lesson.html
  compass-debrief field 52.61 0.42 --alt-ft 2500
`,
  report: `Usage: compass-debrief report <log> [options]

Reads a GPS / attitude log, reconstructs the flight, evaluates the World Magnetic Model along the path,
simulates the compass card and writes an offline HTML debrief.

Options:
  --out FILE          HTML debrief (default: <log name>.debrief.html in the current folder)
  --samples FILE      one row per sample: positions, headings, compass reading and its error (CSV)
  --json FILE         summary: wind, field, turns, episodes, divergences, warnings (JSON)
  --wind W            DDD/SS (from, degrees true / knots, e.g. 250/20), calm, auto (default: from the
                      log's turns and air data), or a wind table file (.csv: alt_ft, alt_m or time_utc,
                      and wind as DDD/SS)
  --plan FILE         intended turns (CSV: target_mag_deg, optional not_before_utc) to grade against
  --excursion S/E     a span flown on the compass, UTC (e.g. 10:12:00/10:20:30), for the excursion analysis
  --tolerance DEG     roll-out tolerance in degrees (default 10)
  --observed FILE     compass readings noted in flight (CSV: time_utc, compass_deg): the card's period,
                      damping, swirl and pendulosity are fitted to them and the fit is reported
  --deviation FILE    compass-swing record (CSV: heading_mag_deg, compass_deg) to apply as deviation
  --compass FILE      compass profile (JSON) replacing the default card parameters
  --format F          force the log format (gpx, csv, igc, nmea, fit, kml) instead of telling it from the content
  --columns MAP       CSV column names for unusual headers: time=Zeit,lat=Breite,lon=Laenge,alt=Hoehe
                      (roles: time date lat lon alt gs track heading roll pitch tas ias hacc), or a file
  --date YYYY-MM-DD   the date for logs that hold only times of day
  --tz-offset ±HH:MM  local time of a log written without a time zone, east of UTC (e.g. +02:00)
  --heading-ref R     what a CSV heading column refers to when its header does not say: true or magnetic
  --aircraft NAME     aircraft shown in the debrief
  --pilot NAME        pilot shown in the debrief
  --quiet             print nothing but errors
  --debug             print a stack trace on failure
  -h, --help          this help

Units: knots, feet and degrees at this interface; magnetic variation and dip from WMM2025.
Exit codes: 0 done, 1 the input cannot be used, 2 the command line is wrong.
Example:
  compass-debrief report my-flight.gpx --wind 250/20 --samples out.csv --json out.json --out out.html
`,
  swing: `Usage: compass-debrief swing <swing.csv> [--json FILE]

Fits Smith's deviation coefficients A to E by least squares to a compass-swing record (columns
heading_mag_deg, compass_deg; five or more headings), prints them, the residuals and a correction card,
and flags any heading whose deviation exceeds the usual 10 degree limit.
Sign convention: deviation = magnetic − compass, easterly +; compass + deviation = magnetic.

Options:
  --json FILE   write the coefficients, residuals and card as JSON
  --quiet       print nothing but errors
  -h, --help    this help
Example:
  compass-debrief swing samples/swing-fenbird.csv --json card.json
`,
  field: `Usage: compass-debrief field <lat> <lon> [--alt-ft N] [--date YYYY-MM-DD]

Magnetic variation (east +), dip (down +), horizontal, vertical and total intensity from the World
Magnetic Model 2025, and whether the place lies in the model's caution or blackout zone of weak
horizontal field. Latitude and longitude in decimal degrees (south and west negative).

Options:
  --alt-ft N        altitude in feet above the WGS-84 ellipsoid (default 0)
  --date YYYY-MM-DD date (default: today)
  --json            print JSON instead of text
  -h, --help        this help
Example:
  compass-debrief field -41.5 173.9 --alt-ft 3000 --date 2026-06-01
`,
  batch: `Usage: compass-debrief batch <folders or logs…> --out-dir DIR [options]

Debriefs every flight log given or found in the folders (searched recursively: files ending .gpx .csv
.igc .nmea .txt .fit .kml, and other files whose content is a log; compass-swing records and other
files are left out with a note), several at a time in analysis processes. DIR receives one debrief per
flight (<name>.debrief.html, <name>.samples.csv, <name>.summary.json), index.html (an overview linking
to each debrief, with each pilot's compass-turn grades across lessons and each aircraft's compass error
across the season), overview.csv, and catalogue.sqlite (one row per flight, kept across runs). A flight
whose log, options and tool version are unchanged since the last run is kept, not analysed again. A
broken log is listed as failed and does not stop the batch.
Tags: --aircraft/--pilot, else a side file <log>.tags.json ({"aircraft": "...", "pilot": "..."}) beside
the log, else the log's own.

Options:
  --out-dir DIR       output folder (required; made when missing)
  --jobs N            flights analysed at once, 1 to 64 (default: the number of processors)
  --wind W            DDD/SS, calm, auto (default) or a wind table file, for every flight
  --deviation FILE    compass-swing record to apply as deviation to every flight
  --compass FILE      compass profile (JSON) for every flight
  --tolerance DEG     roll-out tolerance for grading turns
  --aircraft NAME     aircraft tag for every flight
  --pilot NAME        pilot tag for every flight
  --format, --columns, --date, --tz-offset, --heading-ref
                      how to read the logs, as for report (see compass-debrief report --help)
  --force             analyse every flight again, changed or not
  --quiet             print nothing but errors (the failed flights, one line each)
  --debug             print a stack trace on failure
  -h, --help          this help

Exit codes: 0 the batch ran and at least one flight is ok (failed ones are listed on stderr and in the
overview); 1 every flight failed, or no log was found; 2 the command line is wrong.
Example:
  compass-debrief batch logs/ extra/lesson-12.gpx --out-dir debriefs --wind 250/15 --jobs 4
`,
  demo: `Usage: compass-debrief demo [--out-dir DIR]

Writes the debrief of every bundled sample log (samples/) into DIR (default: compass-debrief-demo).

Options:
  --out-dir DIR   folder for the reports
  --quiet         print nothing but errors
  -h, --help      this help
`,
};

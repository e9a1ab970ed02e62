// The fast scanner of plain XML against saxes. Oracle: saxes (a conformant XML 1.0 parser, the reader's
// general way): wherever plainXmlEvents says a document is plain, saxes must find it well-formed and give
// the very same events (start tags with their lines, attributes, text, end tags with their lines).
import { readFileSync, readdirSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseGpx } from '../../src/import/gpx.js';
import { plainXmlEvents, saxesXmlEvents, type XmlHandlers } from '../../src/import/xmlEvents.js';

type Event = (string | number)[];

/** The events as a list, consecutive text pieces joined (the two may cut character data differently). */
function recorder(): { h: XmlHandlers; events: Event[] } {
  const events: Event[] = [];
  const h: XmlHandlers = {
    openStart: (line) => events.push(['start', line]),
    open: (name, names, values) => events.push(['open', name, JSON.stringify(names.map((k, j) => [k, values[j]]))]),
    text: (chunk) => {
      const last = events[events.length - 1];
      if (last !== undefined && last[0] === 'text') last[1] = `${last[1]}${chunk}`;
      else events.push(['text', chunk]);
    },
    close: (name, line) => events.push(['close', name, line]),
  };
  return { h, events };
}

function bothWays(text: string): { plain: boolean; plainEvents: Event[]; saxesEvents: Event[]; saxesError: unknown } {
  const p = recorder();
  const plain = plainXmlEvents(text, p.h);
  const s = recorder();
  const saxesError = saxesXmlEvents(text, s.h);
  return { plain, plainEvents: p.events, saxesEvents: s.events, saxesError };
}

// Documents near the plain subset: declarations, names, attributes, text and white space of both kinds,
// with line ends LF or CR LF, and now and then something outside it (references, comments, CDATA, '>' in
// text, control characters, a lone CR, non-ASCII, a second root).
const NAMES = ['gpx', 'trk', 'trkseg', 'trkpt', 'ele', 'time', 'name', 'gpxtpx:speed', 'a_b', 'x.y-z'];
const PLAIN_TEXTS = ['<!-- lesson 3 -->', '<!--\r\n two lines -\n-->', '<!---->', '12.5', '2026-05-04T10:00:00Z', 'Harrowgate Fen — circuit', 'two\nlines', 'crlf\r\nline', '  ', '"quoted" \'too\''];
const OTHER_TEXTS = ['a > b', 'odd ]]> end', 'x &amp; y', '<!-- c -->', '<![CDATA[z]]>', '\u0001', 'lone\rcr', '😀', '<?pi x?>', '\uFFFE'];
const PLAIN_ATTRS: [string, string][] = [['lat', '52.5'], ['lon', '-0.25'], ['version', '1.1'], ['creator', 'Fenbird 2 logger'], ['xmlns:gpxtpx', 'http://example.invalid/x'], ['note', 'a > b']];
const OTHER_ATTRS: [string, string][] = [['__proto__', 'x'], ['toString', 'y'], ['creator', 'A &amp; B'], ['tab', 'a\tb'], ['nl', 'a\nb'], ['lt', 'a<b']];
const texts = fc.oneof({ arbitrary: fc.constantFrom(...PLAIN_TEXTS), weight: 12 }, { arbitrary: fc.constantFrom(...OTHER_TEXTS), weight: 1 });
const attrs = fc.oneof({ arbitrary: fc.constantFrom(...PLAIN_ATTRS), weight: 12 }, { arbitrary: fc.constantFrom(...OTHER_ATTRS), weight: 1 });
const DECLS = ['', '<?xml version="1.0"?>', "<?xml version='1.0' encoding='UTF-8'?>", '<?xml version="1.0" encoding="utf-8" standalone="yes"?>', '<?xml  version = "1.0"  ?>', '<?xml version="1.0" standalone="no"?>', '<?xml version="1.1"?>', ' <?xml version="1.0"?>', '<?xml encoding="UTF-8"?>', '<?xml version="1.0" encoding="1x"?>'];

interface Node {
  name: string;
  attrs: [string, string][];
  quote: string;
  spaceAfterName: string;
  kids: (Node | string)[];
  empty: boolean;
}

const node: fc.Arbitrary<Node> = fc.letrec<{ node: Node }>((tie) => ({
  node: fc.record({
    name: fc.constantFrom(...NAMES),
    attrs: fc.array(attrs, { maxLength: 3 }),
    quote: fc.constantFrom('"', "'"),
    spaceAfterName: fc.constantFrom(' ', '\n', '\r\n', '\t', '  '),
    kids: fc.array(fc.oneof({ depthSize: 'small', withCrossShrink: true }, texts, tie('node')), { maxLength: 4 }),
    empty: fc.boolean(),
  }),
})).node;

function serialize(n: Node, nl: string): string {
  const attrs = n.attrs.map(([k, v], j) => `${j === 0 ? n.spaceAfterName : ' '}${k}=${n.quote}${v}${n.quote}`).join('');
  if (n.empty && n.kids.length === 0) return `<${n.name}${attrs}/>`;
  const kids = n.kids.map((k) => (typeof k === 'string' ? k : serialize(k, nl))).join(nl);
  return `<${n.name}${attrs}>${kids}</${n.name}${n.spaceAfterName === '\t' ? '\t' : ''}>`;
}

const documents = fc
  .record({
    decl: fc.constantFrom(...DECLS),
    nl: fc.constantFrom('\n', '\r\n'),
    root: node,
    trailing: fc.oneof({ arbitrary: fc.constantFrom('', '\n', '\r\n\r\n', '\n<!-- end -->\n'), weight: 4 }, { arbitrary: fc.constantFrom(' x', '<gpx/>'), weight: 1 }),
    // One document in three gets one character deleted or one inserted somewhere.
    mutate: fc.oneof(
      { arbitrary: fc.constant(null), weight: 2 },
      { arbitrary: fc.record({ at: fc.nat(), insert: fc.constantFrom('', '<', '>', '&', '"', '/', '\n', '\r', 'x', ' ', '=') }), weight: 1 },
    ),
  })
  .map(({ decl, nl, root, trailing, mutate }) => {
    let text = `${decl}${decl === '' ? '' : nl}${serialize(root, nl)}${trailing}`;
    if (mutate !== null) {
      const at = mutate.at % (text.length + 1);
      text = text.slice(0, at) + mutate.insert + text.slice(at + (mutate.insert === '' ? 1 : 0));
    }
    return text;
  });

describe('plainXmlEvents: the same events as saxes wherever it reads a document', () => {
  it('on random documents near the plain subset, many of them read by the fast scanner', () => {
    let plainCount = 0;
    fc.assert(
      fc.property(documents, (text) => {
        const r = bothWays(text);
        if (!r.plain) return;
        plainCount++;
        expect(r.saxesError).toBeUndefined();
        expect(r.plainEvents).toEqual(r.saxesEvents);
      }),
      { numRuns: 3000, seed: 20261202 },
    );
    // Not a vacuous check: a good share of the documents is read by the fast scanner.
    expect(plainCount).toBeGreaterThan(350); // 454 of the 3000 with this seed
  });

  it('reads every GPX and KML log of the fixtures and samples that it finds plain, with the same events and the same FlightLog', () => {
    const dirs = [new URL('../fixtures/import/', import.meta.url), new URL('../../samples/', import.meta.url)];
    let read = 0;
    for (const dir of dirs) {
      for (const f of readdirSync(dir).filter((x) => x.endsWith('.gpx') || x.endsWith('.kml'))) {
        const text = readFileSync(new URL(f, dir), 'utf8');
        const r = bothWays(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
        if (!r.plain) continue;
        read++;
        expect(r.saxesError, f).toBeUndefined();
        expect(r.plainEvents, f).toEqual(r.saxesEvents);
      }
    }
    expect(read).toBeGreaterThanOrEqual(3); // the samples' three lessons are plain GPX
  });

  it('gives parseGpx the same reading either way on a CR LF log with a name outside ASCII', () => {
    const text = '<?xml version="1.0" encoding="UTF-8"?>\r\n<gpx version="1.1" creator="Fenbird 2 logger">\r\n<trk><name>Harrowgate Fen — circuit</name><trkseg>\r\n'
      + '<trkpt\r\n lat="52.5" lon="-0.25"><ele>12.5</ele><time>2026-05-04T10:00:00Z</time></trkpt>\r\n'
      + '<trkpt lat="52.501" lon="-0.249"><ele>13</ele><time>2026-05-04T10:00:01Z</time></trkpt>\r\n</trkseg></trk></gpx>\r\n';
    expect(plainXmlEvents(text, recorder().h)).toBe(true);
    // The same document made not plain (a CDATA section) goes to saxes and must read the same.
    const viaSaxes = parseGpx(text.replace('<trk>', '<trk><![CDATA[]]>'), 'a.gpx');
    const viaPlain = parseGpx(text, 'a.gpx');
    expect(viaPlain.source.meta).toEqual(viaSaxes.source.meta);
    expect(Array.from(viaPlain.t)).toEqual(Array.from(viaSaxes.t));
    expect(viaPlain.t.length).toBe(2);
    expect(Array.from(viaPlain.line)).toEqual(Array.from(viaSaxes.line));
  });
});

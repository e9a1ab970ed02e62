import { describe, expect, it } from 'vitest';
import { hasSwingRecordHeader } from '../../src/deviation/swingColumns.js';
import { parseSwingRecord } from '../../src/deviation/swingRecord.js';

describe('hasSwingRecordHeader: what the batch takes for a compass-swing record', () => {
  it('sees the header parseSwingRecord reads, after comments and blank lines, in any case and order', () => {
    const text = '\n# swing at the compass base\n\ncompass_deg;Heading_Mag_Deg\n0;1\n45;44\n90;91\n135;136\n180;179\n';
    expect(hasSwingRecordHeader(text)).toBe(true);
    expect(parseSwingRecord(text)).toHaveLength(5); // the same file is one the swing command reads
    expect(hasSwingRecordHeader('"heading_mag_deg"\t"compass_deg"\n')).toBe(true);
  });

  it('is false without both columns, with positions beside them (a samples CSV), or with no header line', () => {
    expect(hasSwingRecordHeader('heading_mag_deg,reading\n0,1\n')).toBe(false);
    expect(hasSwingRecordHeader('time_utc,lat_deg,lon_deg,heading_mag_deg,compass_deg\n')).toBe(false);
    expect(hasSwingRecordHeader('# only a comment\n\n')).toBe(false);
    // Only the first header-like line counts: the columns further down are data, not a header.
    expect(hasSwingRecordHeader('time,lat,lon\nheading_mag_deg,compass_deg\n')).toBe(false);
  });
});

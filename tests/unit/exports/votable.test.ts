import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { toVoTable, xmlEscape } from '../../../src/lib/exports/votable';

describe('VOTable writer', () => {
  const xml = toVoTable(
    [
      { name: 'Sirius', kind: 'custom', ra: 101.28715533, dec: -16.71611586, pmra: -546.01, pmdec: -1223.07, epoch: 2000, notes: 'α CMa' },
      { name: 'A & B <test> "q" \'s\u0001', kind: 'custom', ra: 0, dec: 0 },
    ],
    { title: 'Pointing review <draft>' },
  );
  it('is well-formed XML', () => {
    expect(XMLValidator.validate(xml)).toBe(true);
  });
  it('declares VOTable 1.4, COOSYS ICRS epoch J2000 and the main position UCDs (IVOA VOTable 1.4, UCD1+ list)', () => {
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(xml);
    expect(doc.VOTABLE.version).toBe('1.4');
    expect(doc.VOTABLE.xmlns).toBe('http://www.ivoa.net/xml/VOTable/v1.3');
    const res = doc.VOTABLE.RESOURCE;
    expect(res.COOSYS).toMatchObject({ system: 'ICRS', epoch: 'J2000' });
    const fields = res.TABLE.FIELD as { name: string; ucd: string; unit?: string; ref?: string }[];
    const ra = fields.find((f) => f.name === 'ra')!;
    const dec = fields.find((f) => f.name === 'dec')!;
    expect(ra).toMatchObject({ ucd: 'pos.eq.ra;meta.main', unit: 'deg', ref: 'icrs' });
    expect(dec).toMatchObject({ ucd: 'pos.eq.dec;meta.main', unit: 'deg', ref: 'icrs' });
    const rows = res.TABLE.DATA.TABLEDATA.TR as { TD: unknown[] }[];
    expect(rows).toHaveLength(2);
    expect(rows[0]!.TD[0]).toBe('Sirius');
    expect(Number(rows[0]!.TD[2])).toBeCloseTo(101.28715533, 8);
  });
  it('escapes markup and drops characters XML 1.0 cannot carry', () => {
    expect(xmlEscape('A & B <test> "q" \'s\u0001')).toBe('A &amp; B &lt;test&gt; &quot;q&quot; &apos;s');
    expect(xml).toContain('A &amp; B &lt;test&gt;');
    expect(xml).not.toContain('\u0001');
  });
});

/**
 * IVOA VOTable 1.4 writer for a scene's targets (TABLEDATA serialisation). Pure.
 * VOTable 1.4 keeps the v1.3 namespace (IVOA Recommendation "VOTable Format Definition Version 1.4", 2019).
 * Positions are ICRS at epoch J2000 (COOSYS system="ICRS" epoch="J2000").
 */

export interface VoTarget {
  name: string;
  kind: string;
  ra: number | null;
  dec: number | null;
  epoch?: number | null;
  pmra?: number | null;
  pmdec?: number | null;
  notes?: string | null;
}

/** Escapes text for XML 1.0 content and attributes; drops characters XML 1.0 cannot carry. */
export function xmlEscape(s: string): string {
  return s
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '')
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

const num = (n: number | null | undefined, decimals: number) =>
  n === null || n === undefined || !Number.isFinite(n) ? '' : String(Number(n.toFixed(decimals)));

export interface VoTableOptions {
  title: string;
  /** Free text shown in the table's DESCRIPTION. */
  description?: string;
}

export function toVoTable(targets: VoTarget[], opts: VoTableOptions): string {
  const cell = (s: string) => `<TD>${xmlEscape(s)}</TD>`;
  const rows = targets
    .map(
      (t) =>
        '      <TR>' +
        cell(t.name) +
        cell(t.kind) +
        cell(num(t.ra, 8)) +
        cell(num(t.dec, 8)) +
        cell(num(t.pmra, 4)) +
        cell(num(t.pmdec, 4)) +
        cell(num(t.epoch, 3)) +
        cell(t.notes ?? '') +
        '</TR>',
    )
    .join('\n');
  return `<?xml version="1.0" encoding="UTF-8"?>
<VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://www.ivoa.net/xml/VOTable/v1.3 http://www.ivoa.net/xml/VOTable/votable-1.4.xsd">
  <DESCRIPTION>Targets exported from Armilla. Positions are ICRS, epoch J2000; proper motions in mas/yr (pmra = mu_alpha * cos(delta)).</DESCRIPTION>
  <RESOURCE type="results">
    <COOSYS ID="icrs" system="ICRS" epoch="J2000"/>
    <TABLE name="targets">
      <DESCRIPTION>${xmlEscape(opts.title)}${opts.description ? ` — ${xmlEscape(opts.description)}` : ''}</DESCRIPTION>
      <FIELD name="name" ID="name" datatype="unicodeChar" arraysize="*" ucd="meta.id;meta.main"/>
      <FIELD name="kind" ID="kind" datatype="char" arraysize="*" ucd="meta.code.class"/>
      <FIELD name="ra" ID="ra" datatype="double" unit="deg" ucd="pos.eq.ra;meta.main" ref="icrs"/>
      <FIELD name="dec" ID="dec" datatype="double" unit="deg" ucd="pos.eq.dec;meta.main" ref="icrs"/>
      <FIELD name="pmra" ID="pmra" datatype="double" unit="mas/yr" ucd="pos.pm;pos.eq.ra" ref="icrs"/>
      <FIELD name="pmdec" ID="pmdec" datatype="double" unit="mas/yr" ucd="pos.pm;pos.eq.dec" ref="icrs"/>
      <FIELD name="epoch" ID="epoch" datatype="double" unit="yr" ucd="time.epoch"/>
      <FIELD name="notes" ID="notes" datatype="unicodeChar" arraysize="*" ucd="meta.note"/>
      <DATA>
        <TABLEDATA>
${rows}
        </TABLEDATA>
      </DATA>
    </TABLE>
  </RESOURCE>
</VOTABLE>
`;
}

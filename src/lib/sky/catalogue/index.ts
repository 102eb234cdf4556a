/**
 * The Bright Star Catalogue (5th Rev. Ed., 9,096 stars) as parallel typed arrays, with the usual
 * designations ("α Ori", "58 Ori", "58 α Ori"), proper names and a small search.
 * Data: bsc5.json, built by build-catalogue.mjs (see PROVENANCE.md). J2000 mean places, no proper motion.
 */
import raw from './bsc5.json';

export interface Catalogue {
  count: number;
  hr: Int32Array;
  /** ICRS/J2000 right ascension and declination, degrees. */
  raDeg: Float64Array;
  decDeg: Float64Array;
  /** V magnitude (NaN when the catalogue has none). */
  vmag: Float32Array;
  hd: Int32Array;
  /** Usual short designation: Bayer ("α Ori"), else Flamsteed ("58 Ori"), else "HR n". */
  designation: string[];
  /** Flamsteed and Bayer together when both exist ("58 α Ori"), else as `designation`. */
  fullDesignation: string[];
  /** Primary proper name (IAU WGSN spelling) or null. */
  name: (string | null)[];
  /** All proper names of a star (primary first; e.g. Alpheratz, Sirrah). */
  names: string[][];
  /** IAU constellation abbreviation from the designation ("" when undesignated). */
  con: string[];
  /** Flamsteed number (0 when none). */
  flamsteed: Int32Array;
}

interface RawCatalogue {
  count: number;
  hr: number[];
  raDeg: number[];
  decDeg: number[];
  vmag: (number | null)[];
  hd: number[];
  bayer: string[];
  flamsteed: number[];
  con: string[];
  names: Record<string, string[]>;
}

let cached: Catalogue | null = null;

/** Loads (once) and returns the catalogue. Synchronous: the JSON is bundled. */
export function loadCatalogue(): Catalogue {
  if (cached) return cached;
  const r = raw as unknown as RawCatalogue;
  const n = r.count;
  const designation: string[] = new Array(n);
  const fullDesignation: string[] = new Array(n);
  const name: (string | null)[] = new Array(n);
  const names: string[][] = new Array(n);
  for (let i = 0; i < n; i++) {
    const b = r.bayer[i], f = r.flamsteed[i], c = r.con[i];
    designation[i] = b ? `${b} ${c}` : f ? `${f} ${c}` : `HR ${r.hr[i]}`;
    fullDesignation[i] = b && f ? `${f} ${b} ${c}` : designation[i];
    const nm = r.names[String(r.hr[i])] ?? [];
    names[i] = nm;
    name[i] = nm[0] ?? null;
  }
  cached = {
    count: n,
    hr: Int32Array.from(r.hr),
    raDeg: Float64Array.from(r.raDeg),
    decDeg: Float64Array.from(r.decDeg),
    vmag: Float32Array.from(r.vmag, (v) => (v === null ? NaN : v)),
    hd: Int32Array.from(r.hd),
    designation,
    fullDesignation,
    name,
    names,
    con: r.con.slice(),
    flamsteed: Int32Array.from(r.flamsteed),
  };
  return cached;
}

const GREEK_NAMES: Record<string, string> = {
  α: 'alpha', β: 'beta', γ: 'gamma', δ: 'delta', ε: 'epsilon', ζ: 'zeta', η: 'eta', θ: 'theta', ι: 'iota',
  κ: 'kappa', λ: 'lambda', μ: 'mu', ν: 'nu', ξ: 'xi', ο: 'omicron', π: 'pi', ρ: 'rho', σ: 'sigma', τ: 'tau',
  υ: 'upsilon', φ: 'phi', χ: 'chi', ψ: 'psi', ω: 'omega',
};
const GREEK_ABBR: Record<string, string> = {
  alp: 'alpha', bet: 'beta', gam: 'gamma', del: 'delta', eps: 'epsilon', zet: 'zeta', the: 'theta', iot: 'iota',
  kap: 'kappa', lam: 'lambda', omi: 'omicron', sig: 'sigma', ups: 'upsilon', ome: 'omega',
};
const SUPER: Record<string, string> = { '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9', '⁰': '0' };

/** Lower-case, no diacritics, Greek letters and their abbreviations spelled out, superscripts as digits. */
export function normalizeQuery(s: string): string {
  let t = s.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase();
  t = t.replace(/[¹²³⁴⁵⁶⁷⁸⁹⁰]/g, (c) => SUPER[c] ?? c);
  t = t.replace(/[αβγδεζηθικλμνξοπρστυφχψω]/g, (c) => ` ${GREEK_NAMES[c]} `);
  t = t.replace(/\b(alp|bet|gam|del|eps|zet|the|iot|kap|lam|omi|sig|ups|ome)(?=\d|\b)/g, (m) => GREEK_ABBR[m] ?? m);
  t = t.replace(/([a-z])(\d)/g, '$1 $2').replace(/(\d)([a-z])/g, '$1 $2');
  return t.replace(/[^a-z0-9]+/g, ' ').trim();
}

let keys: string[][] | null = null;
function searchKeys(cat: Catalogue): string[][] {
  if (keys) return keys;
  keys = new Array(cat.count);
  for (let i = 0; i < cat.count; i++) {
    const k = new Set<string>();
    for (const n of cat.names[i]) k.add(normalizeQuery(n));
    k.add(normalizeQuery(cat.designation[i]));
    k.add(normalizeQuery(cat.fullDesignation[i]));
    if (cat.flamsteed[i]) k.add(normalizeQuery(`${cat.flamsteed[i]} ${cat.con[i]}`));
    k.add(`hr ${cat.hr[i]}`);
    if (cat.hd[i]) k.add(`hd ${cat.hd[i]}`);
    keys[i] = [...k];
  }
  return keys;
}

export interface CatalogueHit {
  index: number;
  hr: number;
  designation: string;
  name: string | null;
  raDeg: number;
  decDeg: number;
  vmag: number;
}

/**
 * Search by proper name ("Betelgeuse", "betel"), HR number ("2061", "HR 2061"), HD number ("HD 39801")
 * or designation ("α Ori", "alpha ori", "Alp Ori", "58 Ori"). Exact matches first, then prefixes,
 * then substrings; brighter stars first within each group.
 */
export function searchCatalogue(query: string, limit = 20): CatalogueHit[] {
  const cat = loadCatalogue();
  const q = normalizeQuery(query);
  if (!q) return [];
  const ks = searchKeys(cat);
  const qHr = /^\d+$/.test(q) ? `hr ${q}` : null;
  const scored: { i: number; s: number }[] = [];
  for (let i = 0; i < cat.count; i++) {
    let best = 9;
    for (const k of ks[i]) {
      if (k === q || k === qHr) { best = 0; break; }
      if (k.startsWith(q + ' ') || k.startsWith(q)) best = Math.min(best, 1);
      else if (k.includes(q)) best = Math.min(best, 2);
    }
    if (best < 9) scored.push({ i, s: best });
  }
  scored.sort((a, b) => a.s - b.s || (cat.vmag[a.i] || 99) - (cat.vmag[b.i] || 99));
  return scored.slice(0, Math.max(0, limit)).map(({ i }) => ({
    index: i,
    hr: cat.hr[i],
    designation: cat.designation[i],
    name: cat.name[i],
    raDeg: cat.raDeg[i],
    decDeg: cat.decDeg[i],
    vmag: cat.vmag[i],
  }));
}

/** Index of a star by exact proper name (case and accents ignored), or -1. */
export function findByName(name: string): number {
  const cat = loadCatalogue();
  const q = normalizeQuery(name);
  for (let i = 0; i < cat.count; i++) for (const n of cat.names[i]) if (normalizeQuery(n) === q) return i;
  return -1;
}

/** Index of a star by HR number, or -1. */
export function findByHr(hr: number): number {
  const cat = loadCatalogue();
  let lo = 0, hi = cat.count - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (cat.hr[mid] === hr) return mid;
    if (cat.hr[mid] < hr) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

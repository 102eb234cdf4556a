#!/usr/bin/env node
/**
 * Builds src/lib/sky/catalogue/bsc5.json from the Bright Star Catalogue CSV files in ../shared/data
 * (relative to the repository root). Run with `npm run catalogue`. See PROVENANCE.md beside this file.
 *
 * Output: parallel arrays (one entry per star, in HR order) plus the proper names.
 *   hr, raDeg (J2000, = hours × 15), decDeg, vmag (null when absent), hd,
 *   bayer ("α¹" or ""), flamsteed (58 or 0), con ("Ori" or ""), names: { [hr]: [primary, ...aliases] }.
 * The display forms ("α Ori", "58 Ori", "58 α Ori", "HR 1") are derived at load time (index.ts).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const repoRoot = resolve(here, '../../../..');
const dataDir = resolve(repoRoot, '../shared/data');
const outFile = resolve(here, 'bsc5.json');

const GREEK = {
  Alp: 'α', Bet: 'β', Gam: 'γ', Del: 'δ', Eps: 'ε', Zet: 'ζ', Eta: 'η', The: 'θ', Iot: 'ι', Kap: 'κ',
  Lam: 'λ', Mu: 'μ', Nu: 'ν', Xi: 'ξ', Omi: 'ο', Pi: 'π', Rho: 'ρ', Sig: 'σ', Tau: 'τ', Ups: 'υ',
  Phi: 'φ', Chi: 'χ', Psi: 'ψ', Ome: 'ω',
};
const SUPERSCRIPT = ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'];

/** Minimal RFC 4180 line splitter (the files have no quoted fields, but be safe). */
function splitCsvLine(line) {
  const out = [];
  let cur = '';
  let q = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (q) {
      if (ch === '"' && line[i + 1] === '"') { cur += '"'; i++; }
      else if (ch === '"') q = false;
      else cur += ch;
    } else if (ch === '"') q = true;
    else if (ch === ',') { out.push(cur); cur = ''; }
    else cur += ch;
  }
  out.push(cur);
  return out;
}

function readCsv(file) {
  const text = readFileSync(file, 'utf8').replace(/^\uFEFF/, '');
  const lines = text.split(/\r?\n/).filter((l) => l.length > 0);
  const header = splitCsvLine(lines[0]);
  return lines.slice(1).map((l) => {
    const f = splitCsvLine(l);
    return Object.fromEntries(header.map((h, i) => [h, f[i] ?? '']));
  });
}

/**
 * Parses the catalogue spelling of a Bayer/Flamsteed designation: "58Alp Ori", "Bet1Tuc",
 * "Pi 1Hyi", "1Pi 3Ori", "33 Psc".
 */
export function parseDesignation(raw) {
  const s = raw.trim();
  if (!s) return { flamsteed: 0, bayer: '', con: '' };
  const m = /^(\d{1,3})?\s*(?:([A-Z][a-z]{1,2})\s*(\d)?)?\s*([A-Z][A-Za-z]{2})$/.exec(s);
  if (!m) throw new Error(`Unparsed designation: "${raw}"`);
  const [, fl, greek, sup, con] = m;
  let bayer = '';
  if (greek) {
    const g = GREEK[greek];
    if (!g) throw new Error(`Unknown Greek letter "${greek}" in "${raw}"`);
    bayer = g + (sup ? SUPERSCRIPT[Number(sup)] : '');
  }
  return { flamsteed: fl ? Number(fl) : 0, bayer, con };
}

function main() {
  const stars = readCsv(resolve(dataDir, 'bright-stars.csv'));
  const names = readCsv(resolve(dataDir, 'bright-star-names.csv'));
  const out = {
    source: 'Bright Star Catalogue, 5th Revised Ed. (Hoffleit & Warren 1991; CDS V/50) via ../shared/data/bright-stars.csv; names: IAU Catalog of Star Names (WGSN) spelling via ../shared/data/bright-star-names.csv',
    epoch: 'J2000.0 mean places (ICRS), no proper motion',
    count: stars.length,
    hr: [], raDeg: [], decDeg: [], vmag: [], hd: [],
    bayer: [], flamsteed: [], con: [],
    names: {},
  };
  let prevHr = 0;
  for (const s of stars) {
    const hr = Number(s.hr);
    if (!(hr > prevHr)) throw new Error(`HR numbers not increasing at ${s.hr}`);
    prevHr = hr;
    const raH = Number(s.ra_hours_j2000);
    const dec = Number(s.dec_deg_j2000);
    if (!(raH >= 0 && raH < 24) || !(dec >= -90 && dec <= 90)) throw new Error(`Bad position for HR ${hr}`);
    const d = parseDesignation(s.designation);
    const vmag = s.vmag === '' ? null : Number(s.vmag);
    out.hr.push(hr);
    out.raDeg.push(Math.round(raH * 15 * 1e6) / 1e6);
    out.decDeg.push(dec);
    out.vmag.push(vmag);
    out.hd.push(s.hd === '' ? 0 : Number(s.hd));
    out.bayer.push(d.bayer);
    out.flamsteed.push(d.flamsteed);
    out.con.push(d.con);
  }
  const hrSet = new Set(out.hr);
  for (const n of names) {
    const hr = Number(n.hr);
    if (!hrSet.has(hr)) throw new Error(`Name ${n.name} refers to unknown HR ${n.hr}`);
    (out.names[hr] ??= []).push(n.name);
  }
  writeFileSync(outFile, JSON.stringify(out) + '\n');
  console.log(`Wrote ${outFile}: ${out.count} stars, ${names.length} names for ${Object.keys(out.names).length} stars.`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();

/**
 * SkyModel and the engine adapter: what the view draws and reads out agrees with the sky engine.
 */
import { describe, expect, it } from 'vitest';
import * as sky from '../../../src/lib/sky';
import * as engine from '../../../src/components/sphere/sky-adapter';
import { altAzToEnu, angleDeg } from '../../../src/components/sphere/geometry';
import { SkyModel } from '../../../src/components/sphere/model';

const site = { latDeg: 38.912, lonDeg: -106.254, heightM: 3120 }; // invented demo site
const when = Date.parse('2026-03-20T04:00:00Z');

describe('SkyModel', async () => {
  const cat = await engine.loadCatalogue();
  const m = new SkyModel(site, when);
  m.setCatalogue(cat);

  it('sorts the catalogue brightest first and keeps an HR index', () => {
    for (let i = 1; i < 200; i++) expect(cat.vmag[i]).toBeGreaterThanOrEqual(cat.vmag[i - 1]);
    // Sirius is HR 2491, V = −1.46 (Bright Star Catalogue, 5th rev. ed.).
    expect(cat.hr[0]).toBe(2491);
    expect(cat.hrIndex.get(2491)).toBe(0);
    expect(m.starCountTo(-1)).toBe(1);
  });

  it('bodies carry the engine positions; the fast path agrees with the full one', () => {
    const full = engine.bodies(sky.skyFrame(site, new Date(when + 60_000)));
    const fast = engine.bodiesMoved(sky.skyFrame(site, new Date(when + 60_000)), m.bodies);
    for (let i = 0; i < full.length; i++) {
      expect(fast[i].body).toBe(full[i].body);
      expect(Math.abs(fast[i].altDeg - full[i].altDeg)).toBeLessThan(1e-9);
      expect(Math.abs(fast[i].azDeg - full[i].azDeg)).toBeLessThan(1e-9);
    }
  });

  it('hover readout of a star’s drawn direction gives back its catalogue place', () => {
    const i = cat.hrIndex.get(1713)!; // Rigel (HR 1713)
    const enu = [m.starEnu[i * 3], m.starEnu[i * 3 + 1], m.starEnu[i * 3 + 2]];
    const r = engine.readoutAt(enu, site, new Date(when), m.frame);
    // Aberration (≤ 20.5″) and light deflection are not removed by the readout: 30″ tolerance.
    const sep = angleDeg(sky.vectorInFrame([0, 0, 0], 'icrs', r.raDeg, r.decDeg), sky.vectorInFrame([0, 0, 0], 'icrs', cat.raDeg[i], cat.decDeg[i]));
    expect(sep * 3600).toBeLessThan(30);
    expect(r.constellation).toBe('Ori');
    const o = sky.observe(site, new Date(when), { raDeg: cat.raDeg[i], decDeg: cat.decDeg[i] });
    expect(Math.abs(r.altDeg - o.altDeg)).toBeLessThan(1 / 3600);
    expect(Math.abs(r.haHours - o.haHours) * 15 * 3600).toBeLessThan(30);
    expect(r.zdDeg + r.altDeg).toBeCloseTo(90, 12);
    expect(r.polarDistDeg + r.decDeg).toBeCloseTo(90, 12);
  });

  it('readout of the galactic centre direction gives l = 0, b = 0 (Hipparcos frame; reference values A6)', () => {
    // Galactic centre α 266.404995°, δ −28.936174° (reference values A6).
    const u = sky.vectorInFrame([0, 0, 0], 'icrs', 266.404995, -28.936174);
    const f = sky.skyFrame(site, new Date(when));
    const m3 = f.icrsToEnu;
    const e = [m3[0] * u[0] + m3[1] * u[1] + m3[2] * u[2], m3[3] * u[0] + m3[4] * u[1] + m3[5] * u[2], m3[6] * u[0] + m3[7] * u[1] + m3[8] * u[2]];
    // The readout expects an apparent (refracted) direction: lift it the way the engine does.
    const aa = Math.atan2(e[2], Math.hypot(e[0], e[1])) * 180 / Math.PI;
    const az = Math.atan2(e[0], e[1]) * 180 / Math.PI;
    const app = sky.apparentAltitudeDeg(aa, 'standard');
    const r = engine.readoutAt(altAzToEnu([0, 0, 0], az, app), site, new Date(when), f);
    const l = r.galLDeg > 180 ? r.galLDeg - 360 : r.galLDeg;
    expect(Math.abs(l)).toBeLessThan(0.01);
    expect(Math.abs(r.galBDeg)).toBeLessThan(0.01);
  });

  it('targets: envelope verdicts name the broken limit and the excess', () => {
    m.setPlan({ minAltitude: 30, sunAvoidance: 40 }, [
      { id: 't1', kind: 'custom', name: 'Zenith-ish', ra: 0, dec: 0 },
      { id: 't2', kind: 'star', name: 'Sirius', hr: 2491 },
    ]);
    for (const t of m.targets) {
      const o = sky.observe(site, new Date(when), { raDeg: t.raDeg, decDeg: t.decDeg });
      expect(Math.abs(t.altDeg - o.altDeg)).toBeLessThan(1e-9);
      if (t.altDeg < 30) {
        expect(t.inside).toBe(false);
        expect(t.breaks.join()).toMatch(/below the lowest altitude by \d+\.\d°/);
      }
    }
  });

  it('envelope check of a grid point agrees with the engine evaluateEnvelope', () => {
    const env = { hourAngleLimits: [-2, 2] as [number, number] };
    const e = altAzToEnu([0, 0, 0], 180, 40);
    const hd = m.haDecOfDate(e);
    expect(Math.abs(hd.haHours)).toBeLessThan(1e-9); // on the meridian, south: HA = 0 (common practice)
    const v = engine.checkEnvelope(env, { azDeg: 180, altDeg: 40, haHours: hd.haHours, decDeg: hd.decDeg }, m);
    expect(v.inside).toBe(true);
    const w = engine.checkEnvelope(env, { azDeg: 270, altDeg: 5, ...(() => { const x = m.haDecOfDate(altAzToEnu([0, 0, 0], 270, 5)); return { haHours: x.haHours, decDeg: x.decDeg }; })() }, m);
    expect(w.inside).toBe(false);
    expect(w.breaks[0]).toMatch(/hour-angle/);
  });
});

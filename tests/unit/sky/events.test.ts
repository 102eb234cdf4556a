import { describe, expect, it } from 'vitest';
import { moonPhases, nextEvent, riseTransitSet, riseTransitSetDetailed, skyEvents, twilightEvents } from '../../../src/lib/sky/events';
import { observe, type Target } from '../../../src/lib/sky/observe';
import { bodies } from '../../../src/lib/sky/bodies';
import { skyFrame } from '../../../src/lib/sky/apparent';
import { bodyVector } from '../../../src/lib/sky/bodies';
import { RAD } from '../../../src/lib/sky/math';

const minutes = (a: Date, iso: string) => Math.abs(a.getTime() - new Date(iso).getTime()) / 60000;

describe('rise, transit, set (USNO conventions)', () => {
  it('A14: Venus at Boston, 1988-03-20 (Meeus Ex. 15.a; h0 −0°34′)', () => {
    // rise 12h25m UT, transit 19h41m UT, set 02h55m UT (evening of 19 March local); ±1 min
    const boston = { latDeg: 42 + 20 / 60, lonDeg: -(71 + 5 / 60), heightM: 0 };
    const ev = riseTransitSet(boston, { body: 'venus' }, new Date('1988-03-20T00:00:00Z'), new Date('1988-03-21T00:00:00Z'));
    const get = (k: string) => ev.find((e) => e.kind === k)!.time;
    expect(minutes(get('rise'), '1988-03-20T12:25:00Z')).toBeLessThan(1);
    expect(minutes(get('transit'), '1988-03-20T19:41:00Z')).toBeLessThan(1);
    expect(minutes(get('set'), '1988-03-20T02:55:00Z')).toBeLessThan(1);
  });

  it('events are in time order and at the model altitude within 1 s', () => {
    const site = { latDeg: 51.4769, lonDeg: 0, heightM: 0 };
    const from = new Date('2024-06-01T00:00:00Z'), to = new Date('2024-06-04T00:00:00Z');
    const targets: Target[] = [{ body: 'sun' }, { body: 'moon' }, { body: 'mars' }, { raDeg: 88.79, decDeg: 7.41 }];
    for (const target of targets) {
      const ev = skyEvents(site, target, from, to).events;
      expect(ev.length).toBeGreaterThan(3);
      for (let i = 1; i < ev.length; i++) expect(ev[i].time.getTime()).toBeGreaterThanOrEqual(ev[i - 1].time.getTime());
      for (const e of ev.filter((x) => x.kind === 'rise' || x.kind === 'set')) {
        // altitude rate ≤ 15″/s, so 1 s of time ≤ 0.0042°: check the threshold crossing at ±1 s
        const alt = (t: number) => {
          const f = skyFrame(site, new Date(t));
          const enu = 'body' in target ? bodyVector(f, target.body).enu : observe(site, new Date(t), target, { refraction: 'none' });
          if ('altDeg' in enu) return enu.altDeg;
          return Math.asin((enu as number[])[2]) * RAD;
        };
        let h0 = -34 / 60;
        if ('body' in target && target.body === 'sun') h0 = -50 / 60;
        if ('body' in target && target.body === 'moon') {
          const f = skyFrame(site, e.time);
          h0 = -34 / 60 - Math.asin(1737.4 / bodyVector(f, 'moon').distanceKm) * RAD;
        }
        const t = e.time.getTime();
        const a = alt(t - 1000) - h0, b = alt(t + 1000) - h0;
        expect(a * b).toBeLessThan(0);
      }
    }
  });

  it('day length at φ = 40° near the June solstice is 15.02 h (domain-facts.md, derived with −50′)', () => {
    const site = { latDeg: 40, lonDeg: 0, heightM: 0 };
    const ev = riseTransitSet(site, { body: 'sun' }, new Date('2024-06-20T00:00:00Z'), new Date('2024-06-21T00:00:00Z'));
    const rise = ev.find((e) => e.kind === 'rise')!.time.getTime(), set = ev.find((e) => e.kind === 'set')!.time.getTime();
    expect(Math.abs((set - rise) / 3600000 - 15.02)).toBeLessThan(0.02);
  });

  it('day length at the equator at an equinox is 12.11 h (domain-facts.md, derived with −50′)', () => {
    const site = { latDeg: 0, lonDeg: 0, heightM: 0 };
    const ev = riseTransitSet(site, { body: 'sun' }, new Date('2024-03-20T00:00:00Z'), new Date('2024-03-21T00:00:00Z'));
    const rise = ev.find((e) => e.kind === 'rise')!.time.getTime(), set = ev.find((e) => e.kind === 'set')!.time.getTime();
    expect(Math.abs((set - rise) / 3600000 - 12.11)).toBeLessThan(0.02);
  });

  it('no astronomical darkness at the June solstice for φ ≥ 48.56° N (domain-facts.md, derived)', () => {
    const from = new Date('2024-06-20T12:00:00Z'), to = new Date('2024-06-21T12:00:00Z');
    const at49 = twilightEvents({ latDeg: 49, lonDeg: 0, heightM: 0 }, from, to).map((e) => e.kind);
    const at48 = twilightEvents({ latDeg: 48, lonDeg: 0, heightM: 0 }, from, to).map((e) => e.kind);
    expect(at49).not.toContain('astronomical-dusk');
    expect(at48).toContain('astronomical-dusk');
    expect(at48).toContain('astronomical-dawn');
    expect(at49).toContain('nautical-dusk');
  });

  it('polar day and night for the Sun', () => {
    const from = new Date('2024-06-20T00:00:00Z'), to = new Date('2024-06-22T00:00:00Z');
    expect(riseTransitSetDetailed({ latDeg: 78, lonDeg: 15, heightM: 0 }, { body: 'sun' }, from, to).alwaysUp).toBe(true);
    expect(riseTransitSetDetailed({ latDeg: -78, lonDeg: 15, heightM: 0 }, { body: 'sun' }, from, to).alwaysDown).toBe(true);
  });

  it('nextEvent finds the next sunrise', () => {
    const site = { latDeg: 40, lonDeg: 0, heightM: 0 };
    const e = nextEvent(site, { body: 'sun' }, 'rise', new Date('2024-06-20T12:00:00Z'))!;
    expect(e.time.toISOString().slice(0, 10)).toBe('2024-06-21');
  });
});

describe('the Moon', () => {
  it('phases: new, first quarter, full, last quarter with illuminated fraction 0, ½, 1, ½ (domain-facts.md)', () => {
    const ph = moonPhases(new Date('2024-01-01T00:00:00Z'), new Date('2024-02-01T00:00:00Z'));
    const order = ['new-moon', 'first-quarter', 'full-moon', 'last-quarter'];
    expect(ph.length).toBeGreaterThanOrEqual(4);
    for (let i = 1; i < ph.length; i++) expect(order.indexOf(ph[i].kind)).toBe((order.indexOf(ph[i - 1].kind) + 1) % 4);
    const site = { latDeg: 0, lonDeg: 0, heightM: 0 };
    for (const p of ph) {
      const moon = bodies(site, p.time).find((b) => b.body === 'moon')!;
      const expected = { 'new-moon': 0, 'first-quarter': 0.5, 'full-moon': 1, 'last-quarter': 0.5 }[p.kind];
      expect(Math.abs(moon.illuminatedFraction! - expected)).toBeLessThan(0.03);
    }
    // the full moon of 2024-01-25 17:54 UT (USNO phases table, from memory): ±2 min
    const full = ph.find((p) => p.kind === 'full-moon')!;
    expect(minutes(full.time, '2024-01-25T17:54:00Z')).toBeLessThan(2);
  });

  it('topocentric parallax: the Moon is lower than geocentrically by ≈ HP·cos(alt) (common practice)', () => {
    const moon = bodies({ latDeg: 51.5, lonDeg: 0, heightM: 0 }, new Date('2024-01-20T20:00:00Z'), { refraction: 'none' }).find((b) => b.body === 'moon')!;
    expect(moon.horizontalParallaxDeg!).toBeGreaterThan(0.89);
    expect(moon.horizontalParallaxDeg!).toBeLessThan(1.02);
    expect(Math.abs(moon.parallaxInAltitudeDeg! - moon.horizontalParallaxDeg! * Math.cos(moon.altDeg / RAD))).toBeLessThan(0.02);
    expect(moon.ageDays!).toBeGreaterThan(8);
    expect(moon.ageDays!).toBeLessThan(12);
  });

  it('Moon declination stays within ±28.7° (major standstill; domain-facts.md)', () => {
    const site = { latDeg: 0, lonDeg: 0, heightM: 0 };
    for (let d = 0; d < 40; d++) {
      const o = observe(site, new Date(Date.UTC(2025, 0, 1) + d * 86400000), { body: 'moon' }, { refraction: 'none' });
      expect(Math.abs(o.decOfDateDeg)).toBeLessThan(29.7); // + up to 1° topocentric parallax
    }
  });
});

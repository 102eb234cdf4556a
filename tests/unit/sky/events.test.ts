import { describe, expect, it } from 'vitest';
import { moonPhases, nextEvent, riseTransitSet, riseTransitSetDetailed, skyEvents, twilightEvents } from '../../../src/lib/sky/events';
import { observe, type Target } from '../../../src/lib/sky/observe';
import { bodies } from '../../../src/lib/sky/bodies';
import { RAD } from '../../../src/lib/sky/math';
import stars from '../../reference/stars.json';
import bodiesRef from '../../reference/bodies.json';

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

  it('events are in time order for the Sun, the Moon, a planet and a star', () => {
    const site = { latDeg: 51.4769, lonDeg: 0, heightM: 0 };
    const from = new Date('2024-06-01T00:00:00Z'), to = new Date('2024-06-04T00:00:00Z');
    const targets: Target[] = [{ body: 'sun' }, { body: 'moon' }, { body: 'mars' }, { raDeg: 88.79, decDeg: 7.41 }];
    for (const target of targets) {
      const ev = skyEvents(site, target, from, to).events;
      expect(ev.length).toBeGreaterThan(3);
      for (let i = 1; i < ev.length; i++) expect(ev[i].time.getTime()).toBeGreaterThanOrEqual(ev[i - 1].time.getTime());
    }
  });

  it('a star rises and sets where ERFA atco13 puts it at −34′, within 2 s (tests/reference/stars.py, case star-rise-set-greenwich)', () => {
    const ref = stars.cases.find((c) => c.id === 'star-rise-set-greenwich')!;
    const site = { latDeg: ref.site.lat, lonDeg: ref.site.lon, heightM: ref.site.height };
    const from = new Date(ref.start), to = new Date(Date.parse(ref.start) + ref.hours * 3600000);
    const ev = riseTransitSet(site, { raDeg: ref.ra, decDeg: ref.dec }, from, to).filter((e) => e.kind !== 'transit');
    expect(ev.map((e) => e.kind)).toEqual(ref.instants.map((x) => (x.rising ? 'rise' : 'set')));
    ev.forEach((e, i) => expect(Math.abs(e.time.getTime() - Date.parse(ref.instants[i]!.time))).toBeLessThan(2000));
  });

  // Day lengths: domain-facts.md derives 15.02 h (φ 40°, June solstice) and 12.11 h (equator, equinox) with −50′;
  // the check values are the same events on DE405 + ERFA (tests/reference/bodies.py, DAY_CASES), ±5 s each.
  for (const [name, siteKey, day, hours] of [['φ = 40° near the June solstice', 'lat40', '2024-06-20', 15.02], ['the equator at an equinox', 'equator', '2024-03-20', 12.11]] as const) {
    it(`sunrise and sunset at ${name} within 5 s of DE405 + ERFA (day ≈ ${hours} h, domain-facts.md)`, () => {
      const ref = bodiesRef.events.find((e) => e.site === siteKey && e.from.startsWith(day))!;
      const s = bodiesRef.sites[siteKey as keyof typeof bodiesRef.sites];
      const ev = riseTransitSet({ latDeg: s.lat, lonDeg: s.lon, heightM: s.height }, { body: 'sun' }, new Date(`${day}T00:00:00Z`), new Date(`${day}T23:59:59Z`));
      const get = (k: string, from: { kind: string; time: string | Date }[]) => new Date(from.find((e) => e.kind === k)!.time).getTime();
      expect(Math.abs(get('rise', ev) - get('rise', ref.events))).toBeLessThan(5000);
      expect(Math.abs(get('set', ev) - get('set', ref.events))).toBeLessThan(5000);
      expect(Math.abs((get('set', ev) - get('rise', ev)) / 3600000 - hours)).toBeLessThan(0.005);
    });
  }

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

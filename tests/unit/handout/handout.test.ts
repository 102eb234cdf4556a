import { describe, expect, it } from 'vitest';
import { buildHandout, CHART, moonPhaseName } from '../../../src/lib/handout/handout';
import { e1Scene } from '../exports/fixtures';

describe('handout model', () => {
  const m = buildHandout(e1Scene({ steps: [{ id: 'st1', title: 'Noon', time: '2024-01-15T12:00:00Z', caption: 'Sun up' }] }));
  it('puts Sirius where r = (90 − alt)/90 · R says (E1: alt 20.279789°, A 162.938748°, ERFA atco13)', () => {
    const t = m.chart.targets.find((x) => x.label === 'Sirius (E1)')!;
    const r = Math.hypot(t.x - CHART.cx, t.y - CHART.cy);
    expect(r).toBeCloseTo(((90 - 20.279789) / 90) * CHART.R, 1);
    expect(t.x).toBeLessThan(CHART.cx); // azimuth 163°: just east of south → left of centre
    // The catalogue star (BSC, HR 2491) lands within 0.05° of it (BSC rounding and 24 years of proper motion).
    const star = m.chart.stars.find((s) => s.hr === 2491)!;
    expect(Math.hypot(star.x - t.x, star.y - t.y)).toBeLessThan((0.05 / 90) * CHART.R);
  });
  it('lists the night: sunset before, sunrise after, dusk and dawn twilights (January, φ 51.5°)', () => {
    const kinds = m.events.filter((e) => e.subject === 'Sun').map((e) => e.kind);
    expect(kinds).toEqual(expect.arrayContaining(['set', 'civil-dusk', 'nautical-dusk', 'astronomical-dusk', 'astronomical-dawn', 'rise']));
    expect([...m.events.map((e) => e.time)]).toEqual([...m.events.map((e) => e.time)].sort());
  });
  it('shows the solar caution when a step is in daylight, not for a night-only scene', () => {
    expect(m.solarCaution).toBe(true);
    expect(m.solarReasons.join(' ')).toMatch(/Noon/);
    expect(buildHandout(e1Scene()).solarCaution).toBe(false);
  });
  it('names Moon phases by the Sun–Moon longitude difference (0/90/180/270°, domain facts)', () => {
    expect(moonPhaseName(0)).toBe('New Moon');
    expect(moonPhaseName(90)).toBe('First quarter');
    expect(moonPhaseName(180)).toBe('Full Moon');
    expect(moonPhaseName(270)).toBe('Last quarter');
    expect(moonPhaseName(45)).toBe('Waxing crescent');
    expect(moonPhaseName(350)).toBe('New Moon');
  });
});

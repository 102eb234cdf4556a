import { describe, expect, it } from 'vitest';
import { findByHr, findByName, loadCatalogue, normalizeQuery, searchCatalogue } from '../../../src/lib/sky/catalogue';
import { parseDesignation } from '../../../src/lib/sky/catalogue/build-catalogue.mjs';

describe('Bright Star Catalogue (5th Rev. Ed., Hoffleit & Warren 1991)', () => {
  const cat = loadCatalogue();

  it('has 9,096 stars with positions and magnitudes (shared/data/README.md)', () => {
    expect(cat.count).toBe(9096);
    expect(cat.hr.length).toBe(9096);
    for (let i = 0; i < cat.count; i++) {
      expect(cat.raDeg[i]).toBeGreaterThanOrEqual(0);
      expect(cat.raDeg[i]).toBeLessThan(360);
      expect(Math.abs(cat.decDeg[i])).toBeLessThanOrEqual(90);
    }
    // About 9,100 stars brighter than V 6.5 (domain-facts.md); the faintest are near 8.
    expect(Math.max(...Array.from(cat.vmag).filter((v) => !Number.isNaN(v)))).toBeLessThan(8.5);
  });

  it('carries 115 proper names (shared/data/bright-star-names.csv)', () => {
    expect(cat.names.reduce((n, a) => n + a.length, 0)).toBe(115);
  });

  it('shows designations the usual way', () => {
    const i = findByHr(2061); // Betelgeuse, catalogue spelling "58Alp Ori"
    expect(cat.designation[i]).toBe('α Ori');
    expect(cat.fullDesignation[i]).toBe('58 α Ori');
    expect(cat.name[i]).toBe('Betelgeuse');
    expect(cat.designation[findByHr(3)]).toBe('33 Psc');
    expect(cat.designation[findByHr(1)]).toBe('HR 1');
    expect(cat.designation[findByHr(126)]).toBe('β¹ Tuc');
    expect(parseDesignation('1Pi 3Ori')).toEqual({ flamsteed: 1, bayer: 'π³', con: 'Ori' });
    expect(parseDesignation('Pi 1Hyi')).toEqual({ flamsteed: 0, bayer: 'π¹', con: 'Hyi' });
    expect(parseDesignation('33 Psc')).toEqual({ flamsteed: 33, bayer: '', con: 'Psc' });
  });

  it('Sirius: HR 2491, α CMa, V −1.46, α 6h45m09s δ −16°43′ (BSC5; common knowledge)', () => {
    const i = findByName('sirius');
    expect(cat.hr[i]).toBe(2491);
    expect(cat.designation[i]).toBe('α CMa');
    expect(cat.vmag[i]).toBeCloseTo(-1.46, 2);
    expect(Math.abs(cat.raDeg[i] - 101.2875)).toBeLessThan(0.01);
    expect(Math.abs(cat.decDeg[i] - -16.7161)).toBeLessThan(0.01);
  });

  it('searches by proper name, HR number and designation', () => {
    expect(searchCatalogue('Betelgeuse', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('betel', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('2061', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('HR 2061', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('α Ori', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('alpha ori', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('Alp Ori', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('58 Ori', 5)[0].hr).toBe(2061);
    expect(searchCatalogue('Sirrah', 5)[0].hr).toBe(15);
    expect(searchCatalogue('zzzz', 5)).toEqual([]);
    expect(searchCatalogue('Ori', 500).length).toBeGreaterThan(50);
    expect(normalizeQuery('β¹ Tuc')).toBe('beta 1 tuc');
  });
});

"""Stars moved by their space motion over 50 years, from ERFA pmsafe and atco13 (IAU SOFA). Run by hand:

    /usr/bin/python3 tests/reference/motion.py > tests/reference/motion.json

Inputs are ICRS places at epoch J2000.0 with μα cos δ, μδ (mas/yr), parallax (mas) and radial velocity (km/s).
Barnard's star and Polaris carry catalogue-like values (from memory; only inputs here, their truth does not
matter); the third star is invented, 36″ from the pole, so its RA swings through a large angle; the fourth
has no parallax (pmsafe then uses its minimum parallax, as the product takes it infinitely far).
For each: pmsafe to the observation date (TT) → astrometric place; then atco13 of that place with its
parallax but no proper motion (atco13 would otherwise move it again from J2000) → observed azimuth and
altitude, no refraction.
"""
import json
import math
import sys
import warnings

import erfa

MAS = math.pi / 180 / 3600 / 1000
STARS = [
    dict(name="Barnard's star", ra=269.45207696, dec=4.69336497, pmra=-798.58, pmdec=10328.12, parallax=548.31, rv=-110.51),
    dict(name='Polaris', ra=37.95456067, dec=89.26410897, pmra=44.48, pmdec=-11.85, parallax=7.54, rv=-16.42),
    dict(name='invented star near the north pole', ra=200.0, dec=89.99, pmra=1500.0, pmdec=-800.0, parallax=100.0, rv=30.0),
    dict(name='invented star near the south pole, no parallax', ra=100.0, dec=-89.9, pmra=300.0, pmdec=200.0, parallax=0.0, rv=0.0),
]
SITES = [dict(lat=51.4769, lon=0.0, height=0.0), dict(lat=-30.2446, lon=-70.7494, height=2200.0)]
WHEN = '2050-01-01T03:00:00Z'


def main():
    warnings.simplefilter('ignore')
    u1, u2 = erfa.dtf2d('UTC', 2050, 1, 1, 3, 0, 0.0)
    a1, a2 = erfa.utctai(u1, u2)
    t1, t2 = erfa.taitt(a1, a2)
    out = []
    for s in STARS:
        ra, dec = math.radians(s['ra']), math.radians(s['dec'])
        pmr = s['pmra'] * MAS / math.cos(dec)
        pmd = s['pmdec'] * MAS
        px = s['parallax'] / 1000
        ra2, dec2, pmr2, pmd2, px2, rv2 = erfa.pmsafe(ra, dec, pmr, pmd, px, s['rv'], 2451545.0, 0.0, t1, t2)
        obs = []
        for site in SITES:
            aob, zob, *_ = erfa.atco13(ra2, dec2, 0.0, 0.0, px2, 0.0, u1, u2, 0.0, math.radians(site['lon']),
                                       math.radians(site['lat']), site['height'], 0.0, 0.0, 0.0, 0.0, 0.0, 0.55)
            obs.append({'site': site, 'az': math.degrees(aob) % 360, 'alt': 90 - math.degrees(zob)})
        out.append({**s, 'time': WHEN, 'raAtDate': math.degrees(ra2) % 360, 'decAtDate': math.degrees(dec2), 'observed': obs,
                    'shiftArcsec': math.degrees(erfa.sepp(erfa.s2c(ra, dec), erfa.s2c(ra2, dec2))) * 3600})
    json.dump({'source': 'tests/reference/motion.py: ERFA %s pmsafe, atco13' % erfa.__version__, 'cases': out}, sys.stdout, indent=1)


main()

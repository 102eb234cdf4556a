"""Observed places with non-zero UT1 − UTC and polar motion, from ERFA atco13 (IAU SOFA). Run by hand:

    /usr/bin/python3 tests/reference/earth_orientation.py > tests/reference/earth-orientation.json

Stars of reference-values.md E1, E3, E4 and Polaris (ICRS, no proper motion), sites of those rows, no
refraction (phpa = 0) and standard refraction (1013.25 hPa, 10 °C, RH 0.5, 0.55 µm). The DUT1, xp, yp
values are of the size IERS Bulletin A publishes (invented for the test, not for these dates); each case is
also given with zeros so a test can see the shift they make.
"""
import json
import math
import sys
import warnings

import erfa

AS = math.pi / 180 / 3600
STARS = {
    'E1 Sirius': ((6 + 45 / 60 + 8.91728 / 3600) * 15, -(16 + 42 / 60 + 58.0171 / 3600)),
    'E3 Vega': ((18 + 36 / 60 + 56.33635 / 3600) * 15, 38 + 47 / 60 + 1.2802 / 3600),
    'E4 Canopus': ((6 + 23 / 60 + 57.10988 / 3600) * 15, -(52 + 41 / 60 + 44.3810 / 3600)),
    'Polaris': ((2 + 31 / 60 + 49.09456 / 3600) * 15, 89 + 15 / 60 + 50.7923 / 3600),
}
CASES = [
    ('E1 Sirius', dict(lat=51.4769, lon=0.0, height=0.0), '2024-01-15T22:00:00Z', -0.62, 0.25, 0.41),
    ('E3 Vega', dict(lat=19.8207, lon=-155.4681, height=4207.0), '2023-06-21T10:00:00Z', 0.48, -0.12, 0.33),
    ('E4 Canopus', dict(lat=-33.8688, lon=151.2093, height=0.0), '2025-02-01T12:00:00Z', 0.37, 0.18, 0.47),
    ('Polaris', dict(lat=51.4769, lon=0.0, height=0.0), '2024-01-15T22:00:00Z', -0.62, 0.25, 0.41),
    ('Polaris', dict(lat=-0.5, lon=-70.0, height=0.0), '2024-09-01T03:00:00Z', 0.05, 0.30, 0.30),
]


def observed(ra, dec, site, iso, dut1, xp, yp, refr):
    u1, u2 = erfa.dtf2d('UTC', int(iso[0:4]), int(iso[5:7]), int(iso[8:10]), int(iso[11:13]), int(iso[14:16]), float(iso[17:19]))
    cond = (1013.25, 10.0, 0.5, 0.55) if refr else (0.0, 0.0, 0.0, 0.55)
    aob, zob, hob, dob, rob, eo = erfa.atco13(math.radians(ra), math.radians(dec), 0, 0, 0, 0, u1, u2, dut1,
                                              math.radians(site['lon']), math.radians(site['lat']), site['height'],
                                              xp * AS, yp * AS, *cond)
    return {'az': round(math.degrees(aob) % 360, 9), 'alt': round(90 - math.degrees(zob), 9)}


def main():
    warnings.simplefilter('ignore')
    out = []
    for star, site, iso, dut1, xp, yp in CASES:
        ra, dec = STARS[star]
        out.append({'star': star, 'ra': ra, 'dec': dec, 'site': site, 'time': iso, 'dut1': dut1, 'xp': xp, 'yp': yp,
                    'none': observed(ra, dec, site, iso, dut1, xp, yp, False),
                    'standard': observed(ra, dec, site, iso, dut1, xp, yp, True),
                    'noneWithZeros': observed(ra, dec, site, iso, 0.0, 0.0, 0.0, False)})
    json.dump({'source': 'tests/reference/earth_orientation.py: ERFA %s atco13' % erfa.__version__, 'cases': out}, sys.stdout, indent=1)


main()

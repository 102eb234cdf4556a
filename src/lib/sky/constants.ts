/** Shared numerical constants (sources beside each). */
export const DAYS_PER_CENTURY = 36525;
/** Schwarzschild radius of the Sun in au (2GM☉/c², IAU 2009/2012 constants; as in IAU SOFA). */
export const SUN_SCHWARZSCHILD_AU = 1.97412574336e-8;
/** Speed of light, au per day. */
export const C_AU_PER_DAY = 173.1446326846693;
/** Earth rotation rate, rad/s, from the ERA rate 1.00273781191135448 turns per UT1 day (IERS 2010). */
export const EARTH_ROT_RAD_PER_S = (1.00273781191135448 * 2 * Math.PI) / 86400;
/** WGS84 ellipsoid (NIMA TR8350.2). */
export const WGS84_A_M = 6378137;
export const WGS84_F = 1 / 298.257223563;
export const AU_M = 149597870700;
export const KM_PER_AU = 149597870.7;
/** Mean lunar radius, km (IAU WG on cartographic coordinates); USNO uses k = 0.2725 Earth radii. */
export const MOON_RADIUS_KM = 1737.4;
/** USNO rise/set conventions, degrees (Astronomical Almanac; USNO "Rise, Set, and Twilight Definitions"). */
export const H0_SUN_DEG = -50 / 60;
export const H0_STAR_DEG = -34 / 60;
export const REFRACTION_AT_HORIZON_DEG = 34 / 60;

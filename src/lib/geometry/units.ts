/** International foot, exact (NIST / NOAA-NGS, 85 FR 62698, 2020). */
export const METERS_PER_FOOT = 0.3048;
/** 43,560 sq ft × 0.3048² m² per sq ft, exact. */
export const SQ_METERS_PER_ACRE = 4046.8564224;
export const SQ_FEET_PER_ACRE = 43_560;
export const INCHES_PER_FOOT = 12;

/** WGS84 semi-major axis and flattening (NIMA TR8350.2, 3rd ed., 2000). */
export const WGS84_A = 6_378_137;
export const WGS84_F = 1 / 298.257223563;

export const feetToMeters = (ft: number): number => ft * METERS_PER_FOOT;
export const metersToFeet = (m: number): number => m / METERS_PER_FOOT;
export const squareMetersToAcres = (m2: number): number => m2 / SQ_METERS_PER_ACRE;

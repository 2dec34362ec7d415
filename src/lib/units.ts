// Numbers shown in the farm's chosen units: US customary (acres, feet) or metric (hectares, metres).
// Everything is stored in US customary; only the display changes, so switching units rewrites nothing.
// Pure: no I/O, safe in the browser and on the server.
//
// Conversion factors, NIST Handbook 44 (2023), Appendix C, and NIST Special Publication 811 (2008),
// Appendix B: 1 ft = 0.3048 m exactly; 1 acre = 43,560 sq ft = 4,046.856 m² (international acre;
// the US survey acre is 4,046.873 m²); 1 lb = 0.453 592 37 kg exactly; 1 US gal = 3.785 411 784 L
// exactly. Field areas are computed with the international foot, so acres convert with the
// international acre (the two acres differ by 2 parts per million).
import { formatNumber } from './plans/number-format';
import { METERS_PER_FOOT, SQ_METERS_PER_ACRE } from './geometry/units';

export type UnitSystem = 'us' | 'metric';
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['us', 'metric'];

export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = {
	us: 'US customary (acres, feet)',
	metric: 'Metric (hectares, metres)'
};

export const SQ_METERS_PER_HECTARE = 10_000;
export const KILOGRAMS_PER_POUND = 0.45359237;
export const LITERS_PER_US_GALLON = 3.785411784;

/** Hectares in `acres` acres. */
export const acresToHectares = (acres: number): number => (acres * SQ_METERS_PER_ACRE) / SQ_METERS_PER_HECTARE;
/** Metres in `feet` feet. */
export const feetToMetres = (feet: number): number => feet * METERS_PER_FOOT;

export function isUnitSystem(value: unknown): value is UnitSystem {
	return value === 'us' || value === 'metric';
}

/** The symbol of area in this system: "ac" or "ha". */
export const areaUnit = (units: UnitSystem): 'ac' | 'ha' => (units === 'metric' ? 'ha' : 'ac');
/** The symbol of length in this system: "ft" or "m". */
export const lengthUnit = (units: UnitSystem): 'ft' | 'm' => (units === 'metric' ? 'm' : 'ft');
/** The column heading for areas: "Acres" or "Hectares". */
export const areaHeading = (units: UnitSystem): string => (units === 'metric' ? 'Hectares' : 'Acres');

/** An area given in acres, as a number in the system's unit. */
export const areaIn = (acres: number, units: UnitSystem): number => (units === 'metric' ? acresToHectares(acres) : acres);
/** A length given in feet, as a number in the system's unit. */
export const lengthIn = (feet: number, units: UnitSystem): number => (units === 'metric' ? feetToMetres(feet) : feet);

/** An area stored in acres, with its unit: `formatArea(10, 'metric')` → "4.05 ha". */
export function formatArea(acres: number, units: UnitSystem, decimals = 2): string {
	return `${formatNumber(areaIn(acres, units), decimals)} ${areaUnit(units)}`;
}

/**
 * A change of area with its sign: "+1.2 ac", "−0.4 ha", and "±0.0 ac" when it rounds to nothing
 * at the shown precision (so a tiny negative never reads "−0.0").
 */
export function formatAreaChange(acres: number, units: UnitSystem, decimals = 1): string {
	const value = areaIn(acres, units);
	const half = 0.5 * 10 ** -decimals;
	if (Math.abs(value) < half) return `±${formatNumber(0, decimals)} ${areaUnit(units)}`;
	return `${value > 0 ? '+' : '−'}${formatNumber(Math.abs(value), decimals)} ${areaUnit(units)}`;
}

/** A length stored in feet, with its unit: `formatLength(30, 'metric', 1)` → "9.1 m". */
export function formatLength(feet: number, units: UnitSystem, decimals = 0): string {
	return `${formatNumber(lengthIn(feet, units), decimals)} ${lengthUnit(units)}`;
}

/** Per-acre rate units this module converts, with their metric counterparts and factors. */
const RATES: Record<string, { metric: string; factor: number }> = {
	'lb/ac': { metric: 'kg/ha', factor: (KILOGRAMS_PER_POUND * SQ_METERS_PER_HECTARE) / SQ_METERS_PER_ACRE },
	'gal/ac': { metric: 'L/ha', factor: (LITERS_PER_US_GALLON * SQ_METERS_PER_HECTARE) / SQ_METERS_PER_ACRE },
	'seeds/ac': { metric: 'seeds/ha', factor: SQ_METERS_PER_HECTARE / SQ_METERS_PER_ACRE }
};

/**
 * A rate per acre in the system's units: lb/ac → kg/ha, gal/ac → L/ha, seeds/ac → seeds/ha.
 * Any other unit (pt/ac, fl oz/ac, bags…) is shown as entered, since its metric form is not simple.
 */
export function formatRate(amount: number, unit: string, units: UnitSystem, decimals = 1): string {
	const rate = units === 'metric' ? RATES[unit] : undefined;
	if (!rate) return `${formatNumber(amount, decimals)} ${unit}`;
	return `${formatNumber(amount * rate.factor, decimals)} ${rate.metric}`;
}

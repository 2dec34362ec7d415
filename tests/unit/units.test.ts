// Conversion factors checked against NIST Handbook 44 (2023), Appendix C, "General Tables of Units
// of Measurement", and NIST Special Publication 811 (2008), Appendix B: 1 ft = 0.3048 m exactly;
// 1 acre (international) = 4,046.856 m², 1 acre (US survey) = 4,046.873 m²; 1 ha = 10,000 m²;
// 1 lb = 0.453 592 37 kg; 1 US gal = 3.785 411 784 L.
import { describe, expect, it } from 'vitest';
import {
	acresToHectares, areaHeading, areaIn, feetToMetres, formatArea, formatAreaChange, formatLength, formatRate, isUnitSystem, lengthIn
} from '$lib/units';
import { isKnownTimeZone, timeZoneGroups, timeZones, utcOffsetLabel } from '$lib/time-zones';
import { farmTimeZoneSchema, farmUnitsSchema } from '$lib/schemas/farm-settings';

describe('area', () => {
	it('converts acres with the international acre, within the NIST table\'s rounding', () => {
		// 1 ac = 4,046.856 m² (NIST, rounded to the metre²/1000) = 0.4046856 ha.
		expect(acresToHectares(1)).toBeCloseTo(0.4046856, 7);
		// 100 US survey acres are 40.46873 ha; the international acre is 2 ppm smaller.
		expect(acresToHectares(100)).toBeCloseTo(40.46856, 5);
		expect(Math.abs(acresToHectares(100) - 40.46873)).toBeLessThan(0.0002);
		// 1 ha = 2.471 054 ac (NIST Handbook 44, Appendix C).
		expect(1 / acresToHectares(1)).toBeCloseTo(2.471054, 6);
	});

	it('shows the unit on every area', () => {
		expect(formatArea(160, 'us')).toBe('160.00 ac');
		expect(formatArea(160, 'metric')).toBe('64.75 ha');
		expect(formatArea(1234.5, 'us', 1)).toBe('1,234.5 ac');
		expect(formatArea(0, 'metric', 1)).toBe('0.0 ha');
		expect(areaIn(10, 'us')).toBe(10);
		expect(areaHeading('us')).toBe('Acres');
		expect(areaHeading('metric')).toBe('Hectares');
	});

	it('signs a change and never shows a negative zero', () => {
		expect(formatAreaChange(12.34, 'us')).toBe('+12.3 ac');
		expect(formatAreaChange(-12.34, 'metric')).toBe('−5.0 ha');
		expect(formatAreaChange(-0.04, 'us')).toBe('±0.0 ac');
		// 0.1 ac is 0.04 ha: nothing at one decimal in hectares, something in acres.
		expect(formatAreaChange(0.1, 'metric')).toBe('±0.0 ha');
		expect(formatAreaChange(0.1, 'us')).toBe('+0.1 ac');
	});
});

describe('length', () => {
	it('converts feet with the exact 0.3048 m foot', () => {
		expect(feetToMetres(1)).toBe(0.3048);
		expect(feetToMetres(1000)).toBeCloseTo(304.8, 10);
		expect(lengthIn(30, 'us')).toBe(30);
		expect(formatLength(30, 'us')).toBe('30 ft');
		expect(formatLength(30, 'metric', 2)).toBe('9.14 m');
		expect(formatLength(1320, 'metric', 1)).toBe('402.3 m');
	});
});

describe('rates', () => {
	it('converts the simple per-acre rates and leaves the rest as entered', () => {
		// 1 lb/ac = 0.453 592 37 kg ÷ 0.404 685 6 ha = 1.120 85 kg/ha.
		expect(formatRate(1, 'lb/ac', 'metric', 3)).toBe('1.121 kg/ha');
		expect(formatRate(150, 'lb/ac', 'metric', 0)).toBe('168 kg/ha');
		// 1 gal/ac = 3.785 411 784 L ÷ 0.404 685 6 ha = 9.353 95 L/ha.
		expect(formatRate(10, 'gal/ac', 'metric', 1)).toBe('93.5 L/ha');
		expect(formatRate(34000, 'seeds/ac', 'metric', 0)).toBe('84,016 seeds/ha');
		expect(formatRate(1.5, 'pt/ac', 'metric')).toBe('1.5 pt/ac');
		expect(formatRate(150, 'lb/ac', 'us', 0)).toBe('150 lb/ac');
	});

	it('knows which values are unit systems', () => {
		expect(isUnitSystem('metric')).toBe(true);
		expect(isUnitSystem('si')).toBe(false);
	});
});

describe('time zones and the settings schemas', () => {
	it('offers IANA zones, UTC included, grouped by region', () => {
		const zones = timeZones();
		expect(zones).toContain('America/Chicago');
		expect(zones).toContain('UTC');
		expect(isKnownTimeZone('Europe/Berlin')).toBe(true);
		expect(isKnownTimeZone('Mars/Olympus_Mons')).toBe(false);
		expect(isKnownTimeZone('america/chicago')).toBe(false);
		const groups = timeZoneGroups(['America/Chicago', 'America/Denver', 'UTC']);
		expect(groups).toEqual([{ region: 'America', zones: ['America/Chicago', 'America/Denver'] }, { region: 'Other', zones: ['UTC'] }]);
	});

	it('labels offsets with a real minus sign', () => {
		expect(utcOffsetLabel('America/Chicago', new Date('2026-01-15T12:00:00Z'))).toBe('UTC−06:00');
		expect(utcOffsetLabel('America/Chicago', new Date('2026-07-15T12:00:00Z'))).toBe('UTC−05:00');
		expect(utcOffsetLabel('UTC')).toBe('UTC+00:00');
		expect(utcOffsetLabel('Asia/Kolkata')).toBe('UTC+05:30');
	});

	it('refuses an unknown zone and an unknown unit system with messages that say what to do', () => {
		const bad = farmTimeZoneSchema.safeParse({ timeZone: 'Mars/Olympus_Mons' });
		expect(bad.success).toBe(false);
		expect(bad.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['timeZone', '"Mars/Olympus_Mons" is not a time zone this server knows. Choose one from the list, e.g. America/Chicago.']
		]);
		expect(farmTimeZoneSchema.parse({ timeZone: ' Europe/Berlin ' })).toEqual({ timeZone: 'Europe/Berlin' });
		const units = farmUnitsSchema.safeParse({ units: 'imperial' });
		expect(units.error?.issues[0].message).toBe('Choose US customary or metric.');
	});
});

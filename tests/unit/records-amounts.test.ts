import { describe, expect, it } from 'vitest';
import { laneAcresCovered, laneLengthFt, productTotal, rateBaseUnit, rateWarning, recordAcres, unitMismatchWarning } from '$lib/records/amounts';

// A 20-ft lane 1,320 ft long: 26,400 sq ft = 0.606061 ac (43,560 sq ft per acre, exact).
const lane = { laneIndex: 4, acres: 26_400 / 43_560, widthFt: 20 };

describe('acres of a record', () => {
	it('sums whole lanes', () => {
		expect(recordAcres([{ lane }, { lane: { ...lane, laneIndex: 5 } }])).toBeCloseTo(1.212121, 6);
	});

	it('takes part of a lane by distance along it', () => {
		expect(laneLengthFt(lane)).toBeCloseTo(1320, 9);
		expect(laneAcresCovered(lane, { fromFt: 0, toFt: 660 })).toBeCloseTo(0.303030, 6);
		expect(laneAcresCovered(lane, { fromFt: 330, toFt: 1320 })).toBeCloseTo(0.454545, 6);
		expect(() => laneAcresCovered(lane, { fromFt: 0, toFt: 1400 })).toThrow('Lane 5 is about 1,320 ft long; 1400 ft runs past its end.');
		expect(() => laneAcresCovered(lane, { fromFt: 600, toFt: 600 })).toThrow('Lane 5: "from" must be 0 ft or more and "to" greater than "from".');
	});
});

describe('product totals', () => {
	it('is rate × acres in the rate\'s unit, shown in gallons for liquids: 1.5 pt/ac × 80 ac = 120 pt = 15 gal', () => {
		expect(productTotal(1.5, 'pt/ac', 80)).toEqual({ total: 120, totalUnit: 'pt', shown: { amount: 15, unit: 'gal' } });
		expect(productTotal(32, 'fl oz/ac', 40)).toEqual({ total: 1280, totalUnit: 'fl oz', shown: { amount: 10, unit: 'gal' } });
		expect(productTotal(1, 'qt/ac', 10)).toEqual({ total: 10, totalUnit: 'qt', shown: { amount: 2.5, unit: 'gal' } });
		expect(productTotal(15, 'gal/ac', 12)).toEqual({ total: 180, totalUnit: 'gal', shown: { amount: 180, unit: 'gal' } });
	});

	it('shows dry weights in pounds and leaves other units as they are', () => {
		expect(productTotal(8, 'oz/ac', 10)).toEqual({ total: 80, totalUnit: 'oz', shown: { amount: 5, unit: 'lb' } });
		expect(productTotal(150, 'lb/ac', 2)).toEqual({ total: 300, totalUnit: 'lb', shown: { amount: 300, unit: 'lb' } });
		expect(productTotal(34_000, 'seeds/ac', 2.5)).toEqual({ total: 85_000, totalUnit: 'seeds', shown: { amount: 85_000, unit: 'seeds' } });
	});

	it('refuses a rate of zero or less and a unit it does not know', () => {
		expect(() => productTotal(0, 'pt/ac', 1)).toThrow('A rate must be a number greater than 0.');
		expect(() => productTotal(-1, 'pt/ac', 1)).toThrow('A rate must be a number greater than 0.');
		expect(() => productTotal(1, 'pints', 1)).toThrow(RangeError);
		expect(rateBaseUnit('fl oz / acre')).toBe('fl oz');
		expect(rateBaseUnit('pt/ha')).toBeNull();
	});

	it('warns above the usual most for the unit (common practice), not at it', () => {
		expect(rateWarning(16, 'pt/ac')).toBeNull();
		expect(rateWarning(17, 'pt/ac')).toBe('17 pt/ac is more than the usual most of 16 pt/ac. Saved as entered; check the label and the number.');
		expect(rateWarning(60, 'gal/ac')).toBeNull();
		expect(rateWarning(600, 'gal/ac')).not.toBeNull();
		expect(rateWarning(350_000, 'seeds/ac')).toBe('350,000 seeds/ac is more than the usual most of 300,000 seeds/ac. Saved as entered; check the label and the number.');
	});
});

describe('unit kinds', () => {
	it('warns when a rate is in another kind of unit than the product, not when only the size differs', () => {
		expect(unitMismatchWarning('UAN 32 %', 'gal', 'pt/ac')).toBeNull();
		expect(unitMismatchWarning('starter', 'gal', 'lb/ac')).toBe('starter is measured in gal, but this rate is in lb/ac. Saved as entered; check the unit.');
		expect(unitMismatchWarning('cover mix', 'lb', 'oz/ac')).toBeNull();
		expect(unitMismatchWarning('seed', 'units', 'seeds/ac')).not.toBeNull();
	});
});

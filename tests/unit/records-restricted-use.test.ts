import { describe, expect, it } from 'vitest';
import { rupMissing, rupRecordedLate } from '$lib/records/restricted-use';
import { laneRestrictionsAt } from '$lib/records/restrictions';

// Elements of a restricted-use pesticide record: 7 CFR 110.3 (USDA, private applicators).
const complete = {
	products: [{ position: 0, restrictedUse: true, productName: 'insecticide C', epaRegNo: '00000-333', total: 12.5 }],
	location: 'North field, lanes 1–4',
	acres: 2.4,
	crops: ['corn'],
	endedAt: new Date('2026-07-01T19:00:00Z'),
	applicator: 'A. Applicator',
	applicatorCertNumber: 'PA-0001'
};

describe('restricted-use record completeness', () => {
	it('accepts a record holding every element', () => {
		expect(rupMissing(complete)).toEqual({});
	});

	it('names each missing element on its input', () => {
		const fields = rupMissing({ ...complete, applicator: ' ', applicatorCertNumber: null, products: [{ ...complete.products[0], epaRegNo: null, total: 0 }], location: '', acres: 0, crops: [], endedAt: null });
		expect(Object.keys(fields).sort()).toEqual(['applicator', 'applicatorCertNumber', 'endedAt', 'laneIndexes', 'products.0.productId', 'products.0.rate']);
		expect(fields.laneIndexes).toHaveLength(3); // location, area, crop
	});

	it('asks nothing of a record without restricted-use products', () => {
		expect(rupMissing({ ...complete, applicator: null, applicatorCertNumber: null, products: [{ ...complete.products[0], restrictedUse: false }] })).toEqual({});
	});

	it('is late when completed after 14 calendar days in the farm\'s zone', () => {
		const ended = new Date('2026-07-01T19:00:00Z'); // 14:00 CDT
		expect(rupRecordedLate(ended, new Date('2026-07-15T19:00:00Z'), 'America/Chicago')).toBe(false);
		expect(rupRecordedLate(ended, new Date('2026-07-15T19:00:01Z'), 'America/Chicago')).toBe(true);
	});
});

describe('lane restrictions (pure)', () => {
	const ended = new Date('2026-07-01T19:00:00Z'); // 14:00 CDT on 1 July
	it('counts from the end of application: 12-h REI ending 14:00 → entry from 02:00 the next day (40 CFR 170)', () => {
		const [lane] = laneRestrictionsAt([0], [{ laneIndex: 0, endedAt: ended, reiHours: 12, phiDays: 30, grazingDays: 14 }], new Date('2026-07-01T20:00:00Z'), 'America/Chicago');
		expect(lane).toEqual({ laneIndex: 0, reentryAt: '2026-07-02T07:00:00.000Z', harvestAt: '2026-07-31T19:00:00.000Z', grazingAt: '2026-07-15T19:00:00.000Z' });
	});
	it('lists every lane, null where nothing is in force', () => {
		const lanes = laneRestrictionsAt([0, 1, 2], [{ laneIndex: 1, endedAt: ended, reiHours: null, phiDays: 7, grazingDays: null }], new Date('2026-07-02T00:00:00Z'), 'America/Chicago');
		expect(lanes.map((l) => [l.laneIndex, l.harvestAt])).toEqual([[0, null], [1, '2026-07-08T19:00:00.000Z'], [2, null]]);
	});
});

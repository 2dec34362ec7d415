import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { longestRestriction, restrictionEnds } from '../../../src/lib/agronomy/index.js';
import { expectAgronomyError, frozenCopy } from './expect-error.js';

const HOUR = 3_600_000;

describe('restrictionEnds', () => {
	it('counts an REI in hours from the end of the application', () => {
		// Computed: 40 CFR 170 (Worker Protection Standard): 12-h REI ending 14:00 day 1 → entry from 02:00 day 2
		expect(restrictionEnds(new Date(2025, 6, 1, 14, 0), { hours: 12 })).toEqual(new Date(2025, 6, 2, 2, 0));
		// Computed: 4-h REI ending 09:30 → 13:30 the same day
		expect(restrictionEnds(new Date(2025, 6, 1, 9, 30), { hours: 4 })).toEqual(new Date(2025, 6, 1, 13, 30));
	});

	it('counts PHI and grazing intervals in calendar days', () => {
		// common practice worked value (interval from the label, per NPIC): applied 1 July, PHI 30 d → harvest from 31 July
		expect(restrictionEnds(new Date(2025, 6, 1, 10, 0), { days: 30 })).toEqual(new Date(2025, 6, 31, 10, 0));
		// common practice worked value: grazing interval 14 d → grazing from 15 July
		expect(restrictionEnds(new Date(2025, 6, 1, 10, 0), { days: 14 })).toEqual(new Date(2025, 6, 15, 10, 0));
		// Computed: calendar days run across month ends: 20 July + 30 d → 19 August
		expect(restrictionEnds(new Date(2025, 6, 20, 10, 0), { days: 30 })).toEqual(new Date(2025, 7, 19, 10, 0));
	});

	it('adds days first, then hours, when both are given', () => {
		expect(restrictionEnds(new Date(2025, 6, 1, 20, 0), { days: 1, hours: 6 })).toEqual(new Date(2025, 6, 3, 2, 0));
	});

	it('treats zero as no restriction', () => {
		expect(restrictionEnds(new Date(2025, 6, 1, 14, 0), { hours: 0 })).toEqual(new Date(2025, 6, 1, 14, 0));
	});

	describe('across a clock change (America/Chicago, 9 March 2025)', () => {
		const savedTz = process.env.TZ;
		beforeAll(() => {
			process.env.TZ = 'America/Chicago';
		});
		afterAll(() => {
			if (savedTz === undefined) delete process.env.TZ;
			else process.env.TZ = savedTz;
		});

		it('is really running in a zone with a spring-forward day', () => {
			expect(new Date(2025, 2, 10).getTime() - new Date(2025, 2, 9).getTime()).toBe(23 * HOUR);
		});

		it('counts hours as elapsed time', () => {
			const end = new Date(2025, 2, 8, 20, 0);
			const entry = restrictionEnds(end, { hours: 12 });
			expect(entry.getTime() - end.getTime()).toBe(12 * HOUR);
			// clocks jumped from 02:00 to 03:00, so 12 elapsed hours after 20:00 reads 09:00
			expect(entry).toEqual(new Date(2025, 2, 9, 9, 0));
		});

		it('counts days as calendar days at the same clock time', () => {
			const end = new Date(2025, 2, 8, 20, 0);
			const ends = restrictionEnds(end, { days: 1 });
			expect(ends).toEqual(new Date(2025, 2, 9, 20, 0));
			expect(ends.getTime() - end.getTime()).toBe(23 * HOUR);
		});
	});

	it('rejects bad input', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		expectAgronomyError(
			() => restrictionEnds(new Date(Number.NaN), { hours: 12 }),
			'invalid_date',
			'application end must be a valid date; got an invalid date'
		);
		expectAgronomyError(
			() => restrictionEnds('2025-07-01' as unknown as Date, { hours: 12 }),
			'invalid_date',
			'application end must be a valid date; got "2025-07-01"'
		);
		expectAgronomyError(() => restrictionEnds(end, {}), 'missing_interval', 'interval must give hours or days; got neither');
		expectAgronomyError(() => restrictionEnds(end, { days: 1.5 }), 'not_integer', 'interval days must be a whole number; got 1.5');
		expectAgronomyError(() => restrictionEnds(end, { days: -1 }), 'negative', 'interval days must be 0 days or more; got -1');
		expectAgronomyError(() => restrictionEnds(end, { hours: -12 }), 'negative', 'interval hours must be 0 h or more; got -12');
		expectAgronomyError(
			() => restrictionEnds(end, { hours: Infinity }),
			'not_finite',
			'interval hours must be a finite number; got Infinity'
		);
	});

	it('does not change its input', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		const interval = frozenCopy({ hours: 12, days: 1 });
		const result = restrictionEnds(end, interval);
		expect(end).toEqual(new Date(2025, 6, 1, 14, 0));
		expect(result).not.toBe(end);
		expect(interval).toEqual({ hours: 12, days: 1 });
	});
});

describe('longestRestriction', () => {
	it('returns the interval that ends last (40 CFR 170: the longest applies)', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		// Computed: 40 CFR 170: tank mix with 12-h, 48-h and 24-h REIs → the 48-h one governs, entry 3 July 14:00
		expect(longestRestriction(end, [{ hours: 12 }, { hours: 48 }, { hours: 24 }])).toEqual({
			ends: new Date(2025, 6, 3, 14, 0),
			index: 1
		});
		// Computed: mixed units: 3 calendar days outlast 48 h
		expect(longestRestriction(end, [{ hours: 48 }, { days: 3 }])).toEqual({ ends: new Date(2025, 6, 4, 14, 0), index: 1 });
		// a single product is its own longest
		expect(longestRestriction(end, [{ hours: 4 }])).toEqual({ ends: new Date(2025, 6, 1, 18, 0), index: 0 });
	});

	it('gives ties to the first listed', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		expect(longestRestriction(end, [{ hours: 24 }, { days: 1 }]).index).toBe(0);
		expect(longestRestriction(end, [{ hours: 12 }, { days: 1 }, { hours: 24 }]).index).toBe(1);
	});

	it('rejects bad input, naming the interval', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		expectAgronomyError(
			() => longestRestriction(end, []),
			'empty_list',
			'intervals must be a list with at least one entry; got an empty list'
		);
		expectAgronomyError(
			() => longestRestriction(end, [{ hours: 12 }, { hours: NaN }]),
			'not_finite',
			'interval 2 hours must be a finite number; got NaN'
		);
		expectAgronomyError(
			() => longestRestriction(end, [{ hours: 12 }, { hours: 4 }, {}]),
			'missing_interval',
			'interval 3 must give hours or days; got neither'
		);
		expectAgronomyError(
			() => longestRestriction(new Date(Number.NaN), [{ hours: 12 }]),
			'invalid_date',
			'application end must be a valid date; got an invalid date'
		);
	});

	it('does not change its input', () => {
		const end = new Date(2025, 6, 1, 14, 0);
		const intervals = frozenCopy([{ hours: 12 }, { days: 2 }]);
		longestRestriction(end, intervals);
		expect(end).toEqual(new Date(2025, 6, 1, 14, 0));
		expect(intervals).toEqual([{ hours: 12 }, { days: 2 }]);
	});
});

import { describe, expect, it } from 'vitest';
import { compactNumbers, condenseWarnings, lanesWord } from '$lib/farm/condense';

describe('compact lane lists', () => {
	it('lists a few numbers in full and a long run as first three … last', () => {
		expect(compactNumbers([3, 1, 2])).toBe('1, 2, 3');
		expect(compactNumbers([1, 2, 3, 4, 5, 6])).toBe('1, 2, 3, 4, 5, 6');
		expect(compactNumbers(Array.from({ length: 31 }, (_, i) => 62 - 2 * i))).toBe('2, 4, 6 … 62');
		expect(compactNumbers([5, 5, 5])).toBe('5');
		expect(compactNumbers([])).toBe('');
		expect(lanesWord(1)).toBe('1 lane');
		expect(lanesWord(31)).toBe('31 lanes');
	});
});

describe('condensed warnings', () => {
	it('says each kind once with its lanes, keeps the full list, and leaves lane-less warnings as they are', () => {
		const corn = Array.from({ length: 31 }, (_, i) => ({ kind: 'corn_borders_corn', laneIndex: 2 * i + 1, message: `Lane ${2 * i + 2} (corn) borders last season's corn: scout its edge row for rootworm.` }));
		const out = condenseWarnings([{ kind: 'same_crop', laneIndex: null, message: '0.50 ac of corn follows corn.' }, ...corn], {
			corn_borders_corn: (n, lanes) => `${n} corn lanes (${lanes}) border last season's corn: scout their edge rows for rootworm.`
		});
		expect(out.map((w) => w.summary)).toEqual([
			'0.50 ac of corn follows corn.',
			"31 corn lanes (2, 4, 6 … 62) border last season's corn: scout their edge rows for rootworm."
		]);
		expect(out[1].details).toHaveLength(31);
		expect(out[1].laneNumbers[30]).toBe(62);
	});

	it('keeps a single lane warning word for word, and falls back to a generic line for unknown kinds', () => {
		const one = condenseWarnings([{ kind: 'x', laneIndex: 4, message: 'Lane 5 is odd.' }]);
		expect(one[0].summary).toBe('Lane 5 is odd.');
		const many = condenseWarnings([{ kind: 'x', laneIndex: 4, message: 'Lane 5 is odd.' }, { kind: 'x', laneIndex: 6, message: 'Lane 7 is odd.' }]);
		expect(many[0].summary).toBe('2 lanes (5, 7): Lane 5 is odd.');
	});
});

import { planterCheckSummary } from '$lib/farm/planter-check';
import { layoutStrips } from '$lib/geometry/index';
import { rectangle } from '../fixtures/rectangle';

describe('planter check summary', () => {
	const boundary = rectangle(320, 600);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const pattern = [{ kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 }];
	const { lanes } = layoutStrips({ boundary, guidance: { a: sw, b: nw }, pattern });
	const units = (cornUnits: number, total: number) => Array.from({ length: total }, (_, i) => ({ unit: i + 1, seed: i < cornUnits ? { crop: 'corn', variety: null } : { crop: 'soybean', variety: null }, fertilizerOn: [] }));

	it('passes a split planter that matches the lanes', () => {
		const s = planterCheckSummary(lanes, pattern, { rowSpacingIn: 30, fertilizerLines: [], rowUnits: units(8, 16) });
		expect(s.error).toBeNull();
		expect(s.stops).toBe(0);
		expect(s.ok).toBe(true);
	});

	it('counts STOP findings by kind, STOP kinds first', () => {
		const s = planterCheckSummary(lanes, pattern, { rowSpacingIn: 20, fertilizerLines: [], rowUnits: units(8, 16) });
		expect(s.ok).toBe(false);
		expect(s.stops).toBeGreaterThan(0);
		expect(s.kinds[0].severity).toBe('stop');
		expect(s.kinds.reduce((n, k) => n + k.count, 0)).toBe(s.stops + s.warnings);
		expect(s.kinds.map((k) => k.problem)).toContain('planter row spacing differs from the lane');
	});

	it('says why a planter without row units cannot be checked', () => {
		const s = planterCheckSummary(lanes, pattern, { rowSpacingIn: 30, fertilizerLines: [], rowUnits: [] });
		expect(s.ok).toBe(false);
		expect(s.error).toMatch(/row unit/i);
	});
});

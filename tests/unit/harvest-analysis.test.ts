import { describe, expect, it } from 'vitest';
import { checkComparisons, edgeEffects, landEquivalent, laneYields, varietyTrials, type AnalysisEntry, type AnalysisLane } from '$lib/harvest/analysis';
import { groundHistory } from '$lib/harvest/season-over-season';
import { parseLaneList } from '$lib/harvest/lane-list';
import { rectangle } from '../fixtures/rectangle';

const lane = (i: number, crop: string, extra: Partial<AnalysisLane> = {}): AnalysisLane => ({
	laneIndex: i, kind: 'crop', crop, acres: 1, widthFt: 20, rows: 8, borderRows: 2, variety: null, trialLabel: null, ...extra
});
const load = (laneIndexes: number[], crop: string, bushelsPerAcre: number, rowPosition: AnalysisEntry['rowPosition'] = 'all', harvestedAcres = 1): AnalysisEntry => ({ laneIndexes, crop, bushelsPerAcre, rowPosition, harvestedAcres });

describe('lane yields', () => {
	it('weights loads by their acres, joins outside and inside rows by their rows, and falls back to the yield monitor', () => {
		const lanes = [lane(0, 'corn'), lane(1, 'corn'), lane(2, 'corn')];
		const y = laneYields(lanes, [load([0], 'corn', 200, 'all', 1), load([0], 'corn', 220, 'all', 3), load([1], 'corn', 240, 'outside'), load([1], 'corn', 200, 'inside')], [{ laneIndex: 2, meanBushelsPerAcre: 190, points: 40 }]);
		expect(y[0]).toMatchObject({ laneYield: 215, source: 'scale', entries: 2 });
		expect(y[1]).toMatchObject({ laneYield: (240 * 2 + 200 * 6) / 8, source: 'rows' });
		expect(y[2]).toMatchObject({ laneYield: 190, source: 'monitor' });
	});
});

describe('edge effect on a small known data set', () => {
	it('pairs outside and inside rows within each lane: corn +20, +25, +15 → +20 bu/ac, 95 % CI 20 ± 4.303 × 5/√3', () => {
		const lanes = [lane(0, 'corn'), lane(2, 'corn'), lane(4, 'corn'), lane(1, 'soybean')];
		const entries = [
			load([0], 'corn', 220, 'outside'), load([0], 'corn', 200, 'inside'),
			load([2], 'corn', 215, 'outside'), load([2], 'corn', 190, 'inside'),
			load([4], 'corn', 225, 'outside'), load([4], 'corn', 210, 'inside'),
			load([1], 'soybean', 55, 'all')
		];
		const [corn, ...rest] = edgeEffects(laneYields(lanes, entries), entries);
		expect(rest).toEqual([]);
		expect(corn).toMatchObject({ crop: 'corn', lanes: 3, entries: 6, outsideMean: 220, insideMean: 200 });
		expect(corn.comparison.difference).toBe(20);
		// s_d = 5; t(0.975, 2) = 4.303 (any t table, e.g. Student 1908 / Fisher & Yates).
		const half = (4.302652729749752 * 5) / Math.sqrt(3);
		expect(corn.comparison.ci95![0]).toBeCloseTo(20 - half, 9);
		expect(corn.comparison.ci95![1]).toBeCloseTo(20 + half, 9);
		expect(corn.percent).toBeCloseTo(10, 12);
		expect(corn.comparison.warning).toBeNull();
	});
});

describe('like with like', () => {
	it('compares hybrids only among lanes with the same border rows, and warns with one replication', () => {
		const block = { trialLabel: 'hybrid comparison' };
		const lanes = [
			lane(0, 'corn', { ...block, variety: 'hybrid A', borderRows: 1 }),
			lane(2, 'corn', { ...block, variety: 'hybrid B' }),
			lane(4, 'corn', { ...block, variety: 'hybrid A' }),
			lane(6, 'corn', { ...block, variety: 'hybrid B' })
		];
		const [trial] = varietyTrials(laneYields(lanes, [load([0], 'corn', 230), load([2], 'corn', 210), load([4], 'corn', 200), load([6], 'corn', 212)]));
		expect(trial.block).toBe('hybrid comparison');
		expect(trial.varieties).toEqual([
			{ variety: 'hybrid A', lanes: 1, mean: 230, stratum: 'whole lanes, 1 of 8 rows border rows' },
			{ variety: 'hybrid A', lanes: 1, mean: 200, stratum: 'whole lanes, 2 of 8 rows border rows' },
			{ variety: 'hybrid B', lanes: 2, mean: 211, stratum: 'whole lanes, 2 of 8 rows border rows' }
		]);
		expect(trial.comparisons).toHaveLength(1);
		expect(trial.comparisons[0]).toMatchObject({ label: 'hybrid B', against: 'hybrid A', stratum: 'whole lanes, 2 of 8 rows border rows' });
		expect(trial.comparisons[0].comparison.difference).toBe(11);
		expect(trial.comparisons[0].comparison.ci95).toBeNull();
		expect(trial.comparisons[0].comparison.warning).toMatch(/^Only 1 replication/);
	});

	it('sets wide-row strips against the 30-in check strip by row layout', () => {
		const lanes = [
			lane(0, 'corn', { widthFt: 60, rows: 12, borderRows: 0 }), lane(1, 'corn', { widthFt: 20, rows: 8, borderRows: 0, trialLabel: '30-in check' }),
			lane(2, 'corn', { widthFt: 60, rows: 12, borderRows: 0 }), lane(3, 'corn', { widthFt: 20, rows: 8, borderRows: 0, trialLabel: '30-in check' }),
			lane(4, 'corn', { widthFt: 60, rows: 12, borderRows: 0 }), lane(5, 'corn', { widthFt: 20, rows: 8, borderRows: 0, trialLabel: '30-in check' })
		];
		const y = laneYields(lanes, [170, 205, 176, 210, 168, 207].map((v, i) => load([i], 'corn', v)));
		const [c] = checkComparisons(y);
		expect(c).toMatchObject({ label: 'corn, 12 rows on 60 in', against: 'corn check strip (8 rows on 30 in)', stratum: 'whole lanes, no border rows' });
		expect(c.comparison.replications).toBe(3);
		// strips (170 + 176 + 168) ÷ 3 = 171.33; checks (205 + 210 + 207) ÷ 3 = 207.33
		expect(c.comparison.difference).toBeCloseTo(-36, 9);
	});
});

describe('land equivalent ratio', () => {
	it('strips at half the land each yielding 230 and 57 against sole 200 and 60 → 1.050 (Mead & Willey 1980, worked by hand)', () => {
		const lanes = [lane(0, 'corn'), lane(1, 'soybean'), lane(2, 'corn'), lane(3, 'soybean')];
		const y = laneYields(lanes, [load([0, 2], 'corn', 230), load([1, 3], 'soybean', 57)]);
		const r = landEquivalent(y, { corn: 200, soybean: 60 });
		expect(r.ler).toBeCloseTo(1.05, 12);
		expect(r.crops.map((c) => [c.crop, c.landShare, c.soleFrom])).toEqual([['corn', 0.5, 'entered'], ['soybean', 0.5, 'entered']]);
		const missing = landEquivalent(y, { corn: 200 });
		expect(missing.ler).toBeNull();
		expect(missing.missing).toEqual(['soybean']);
	});
});

describe('the same ground across seasons', () => {
	it('follows a 10-ft shift by overlap: half of each new lane lay under each old one', () => {
		// Two 20-ft lanes this year, shifted 10 ft east of last year's lanes.
		const strip = (fromFt: number) => rectangle(20, 1000, -94.2 + (fromFt * 0.3048) / (111_320 * Math.cos((43.9 * Math.PI) / 180)), 43.9);
		const current = [{ laneIndex: 0, crop: 'soybean', geometry: strip(10) }, { laneIndex: 1, crop: 'corn', geometry: strip(30) }];
		const past = [
			{ season: 2025, laneIndex: 0, crop: 'corn', geometry: strip(0), bushelsPerAcre: 200 },
			{ season: 2025, laneIndex: 1, crop: 'soybean', geometry: strip(20), bushelsPerAcre: 60 },
			{ season: 2025, laneIndex: 2, crop: 'corn', geometry: strip(40), bushelsPerAcre: 210 }
		];
		const [a, b] = groundHistory(current, past);
		expect(a.seasons).toHaveLength(1);
		expect(a.seasons[0].crops.map((c) => c.crop).sort()).toEqual(['corn', 'soybean']);
		expect(a.seasons[0].crops.map((c) => c.share.toFixed(2))).toEqual(['0.50', '0.50']);
		expect(a.seasons[0].bushelsPerAcre).toBeCloseTo(130, 1);
		expect(b.seasons[0].bushelsPerAcre).toBeCloseTo(135, 1);
		expect(a.seasons[0].weighedShare).toBeCloseTo(1, 2);
	});
});

describe('lane lists as typed', () => {
	it('reads numbers from 1, lists and ranges', () => {
		expect(parseLaneList('3')).toEqual({ indexes: [2] });
		expect(parseLaneList('3, 5 7-9')).toEqual({ indexes: [2, 4, 6, 7, 8] });
		expect(parseLaneList('0')).toEqual({ error: '"0" is not a lane number (lanes are numbered from 1).' });
		expect(parseLaneList(' ')).toEqual({ error: 'Give the lane numbers, e.g. 3 or 3, 5 or 3-6.' });
	});
});

import { describe, expect, it } from 'vitest';
import { seedQuantities } from '$lib/equipment/index';

const lane = (index: number, crop: string, acres: number) => ({ index, kind: 'crop' as const, crop, widthFt: 20, rows: 8, offsetFt: index * 20, acres, rowSpacingIn: 30 });
const assign = (laneIndex: number, variety: string | null, populationPerAcre: number | null) => ({ laneIndex, variety, populationPerAcre, relativeMaturity: null, seedLot: null, trialLabel: null, notes: null });

describe('seed needed without a planter', () => {
	it('80 ac × 34,000 ÷ 80,000 = 34.0 corn units', () => {
		// Arithmetic; 80,000 kernels per corn unit is common practice.
		const lanes = [0, 1, 2, 3].map((i) => lane(i, 'corn', 20));
		const { varieties } = seedQuantities(lanes, lanes.map((l) => assign(l.index, 'hybrid A', 34_000)));
		expect(varieties).toHaveLength(1);
		expect(varieties[0]).toMatchObject({ crop: 'corn', variety: 'hybrid A', acres: 80, seeds: 2_720_000, seedsPerUnit: 80_000, unitsExact: 34, unitsWhole: 34 });
	});
	it('uses 140,000 seeds per soybean unit and notes lanes with no population', () => {
		const lanes = [lane(0, 'soybean', 10), lane(1, 'soybean', 5)];
		const { varieties, notes } = seedQuantities(lanes, [assign(0, null, 140_000), assign(1, null, null)]);
		expect(varieties[0]).toMatchObject({ acres: 10, seeds: 1_400_000, seedsPerUnit: 140_000, unitsExact: 10 });
		expect(notes).toEqual(['Lane 2 (soybean) has no seeding rate entered; it is left out of the seed amounts.']);
	});
});

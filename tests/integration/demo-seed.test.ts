// The invented demo as seeded: every lane's seed is a variety of that lane's own crop.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import './helpers';

const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';

// The demo's seed catalogue, written out by hand: which crop each variety name is.
const VARIETY_CROP: Record<string, string> = {
	'hybrid A (105-day)': 'corn',
	'hybrid C (102-day)': 'corn',
	'hybrid A': 'corn',
	'hybrid B': 'corn',
	'hybrid D': 'corn',
	'hybrid E': 'corn',
	'soybean line 2.1': 'soybean'
};

interface AssignedLane {
	field: string;
	season: number;
	variant: string;
	laneIndex: number;
	crop: string;
	variety: string;
}

async function assignedLanes(): Promise<AssignedLane[]> {
	return db()('plan_lanes as l')
		.join('plans as p', 'p.id', 'l.plan_id')
		.join('fields as f', 'f.id', 'p.field_id')
		.where('l.farm_id', DEMO_FARM_ID)
		.whereNull('p.deleted_at')
		.whereNotNull('l.variety')
		.select('f.name as field', 'p.season', 'p.variant', 'l.lane_index as laneIndex', 'l.crop', 'l.variety')
		.orderBy(['f.name', 'p.season', 'p.variant', 'l.lane_index']);
}

describe('demo plans', () => {
	it('give every lane a variety of its own crop', async () => {
		const lanes = await assignedLanes();
		const wrong = lanes
			.filter((l) => VARIETY_CROP[l.variety] !== l.crop)
			.map((l) => `${l.field} ${l.season} ${l.variant} lane ${l.laneIndex + 1}: ${l.crop} lane given "${l.variety}" (${VARIETY_CROP[l.variety] ?? 'not in the catalogue'})`);
		expect(wrong).toEqual([]);
	});

	it('assign both crops on North 80 in every demo season', async () => {
		const lanes = (await assignedLanes()).filter((l) => l.field === 'North 80' && l.variant === 'main');
		const bySeason = new Map<number, Set<string>>();
		for (const l of lanes) bySeason.set(l.season, (bySeason.get(l.season) ?? new Set()).add(`${l.crop}: ${l.variety}`));
		expect([...bySeason.keys()].sort()).toEqual([2025, 2026, 2027]);
		for (const [season, pairs] of bySeason) {
			expect([...pairs].sort(), String(season)).toEqual(['corn: hybrid A (105-day)', 'soybean: soybean line 2.1']);
		}
	});
});

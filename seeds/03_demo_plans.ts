// The invented demo scenario, part 3: adopted plans for the two past seasons and the coming one
// on every demo field, a variant, a hybrid comparison block and 30-in check strips.
// Saved through the same module the app uses, so lanes and acres are computed the real way.
import type { Knex } from 'knex';
import type { LaneSpec } from '../src/lib/geometry/index';
import type { LaneAssignment } from '../src/lib/plans/types';
import { savePlan } from '../src/lib/server/plans';
import { closeDb } from '../src/lib/server/db';
import type { FarmAccess } from '../src/lib/server/access';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { at, DEMO_FIELDS, NORTH80_ORIGIN, PASTURE_ORIGIN, WIDE_ORIGIN } from './02_demo_fields';
import { DEMO_VARIETIES, DEMO_VARIETY_ROWS } from './05_demo_catalog';

export const DEMO_SEASONS = [2025, 2026, 2027] as const;

const corn = (rows: number, rowSpacingIn: number, twinSpacingIn?: number): LaneSpec => ({ kind: 'crop', crop: 'corn', rows, rowSpacingIn, ...(twinSpacingIn ? { twinSpacingIn } : {}) });
const soybean = (rows: number): LaneSpec => ({ kind: 'crop', crop: 'soybean', rows, rowSpacingIn: 30 });
const pasture = (widthFt: number): LaneSpec => ({ kind: 'pasture', crop: 'pasture', widthFt });

const blank = { relativeMaturity: null, seedLot: null, notes: null };

interface DemoPlan {
	fieldId: string;
	variant: string;
	guidance: { a: [number, number]; b: [number, number] };
	pattern: LaneSpec[];
	headlandFt: number;
	offsetBySeason: Record<number, number>;
	assignments?: (lanes: PlannedLane[]) => LaneAssignment[];
}

type PlannedLane = { index: number; crop: string; patternIndex: number };

/**
 * A catalogue variety's name, checked against the lane's crop: the demo assigns seed only from
 * the farm's catalogue, so a corn lane cannot be given a soybean line.
 */
function catalogue(key: keyof typeof DEMO_VARIETIES, crop: string): string {
	const v = DEMO_VARIETY_ROWS.find((r) => r.id === DEMO_VARIETIES[key]);
	if (!v || v.crop !== crop) throw new Error(`Demo seed: ${key} is not a ${crop} variety.`);
	return v.name;
}

/** The seed each crop's lanes get in the demo; a lane is given the seed of its own crop. */
const DEMO_SEED: Record<string, { variety: string; populationPerAcre: number }> = {
	corn: { variety: catalogue('cornHybridA', 'corn'), populationPerAcre: 34_000 },
	soybean: { variety: catalogue('soybeanLineA', 'soybean'), populationPerAcre: 140_000 }
};

const seedByCrop = (lanes: PlannedLane[]): LaneAssignment[] =>
	lanes
		.filter((l) => DEMO_SEED[l.crop])
		.map((l) => ({ laneIndex: l.index, ...DEMO_SEED[l.crop], trialLabel: null, ...blank }));

const plans: DemoPlan[] = [
	{
		fieldId: DEMO_FIELDS.north80,
		variant: 'main',
		guidance: { a: at(NORTH80_ORIGIN, 0, 0), b: at(NORTH80_ORIGIN, 0, 2640) },
		pattern: [corn(8, 30), soybean(8)],
		headlandFt: 40,
		offsetBySeason: { 2025: 0, 2026: 20, 2027: 40 },
		assignments: seedByCrop
	},
	{
		fieldId: DEMO_FIELDS.north80,
		variant: '12/12 strips',
		guidance: { a: at(NORTH80_ORIGIN, 0, 0), b: at(NORTH80_ORIGIN, 0, 2640) },
		pattern: [corn(12, 30), soybean(12)],
		headlandFt: 40,
		offsetBySeason: { 2027: 30 }
	},
	{
		fieldId: DEMO_FIELDS.wideRow,
		variant: 'main',
		guidance: { a: at(WIDE_ORIGIN, 10, 0), b: at(WIDE_ORIGIN, 10, 1600) },
		// Twin rows 8 in apart on 60, 72 and 90-in centres with a cover mix in the middles, and a
		// 30-in check strip in every repeat.
		pattern: [corn(12, 60, 8), corn(10, 72, 8), corn(8, 90, 8), corn(8, 30)],
		headlandFt: 30,
		offsetBySeason: { 2025: 0, 2026: 3.75, 2027: 7.5 },
		// Every lane is corn; the 30-in lanes are the check strips.
		assignments: (lanes) =>
			lanes.map((l) => ({ laneIndex: l.index, variety: catalogue('cornHybridC', l.crop), populationPerAcre: 32_000, trialLabel: l.patternIndex === 3 ? '30-in check' : null, ...blank }))
	},
	{
		fieldId: DEMO_FIELDS.pasture,
		variant: 'main',
		guidance: { a: at(PASTURE_ORIGIN, 0, 0), b: at(PASTURE_ORIGIN, 0, 1320) },
		// Corn and soybean strips, each beside a 10-ft pasture lane: ewes on one, pigs on the other.
		pattern: [corn(8, 30), pasture(10), soybean(8), pasture(10)],
		headlandFt: 30,
		offsetBySeason: { 2025: 0, 2026: 30, 2027: 60 },
		assignments: hybridBlock
	}
];

/** Hybrid comparison block: the first four corn lanes of the pasture field each get a hybrid. */
function hybridBlock(lanes: PlannedLane[]): LaneAssignment[] {
	const cornLanes = lanes.filter((l) => l.crop === 'corn').slice(0, 4);
	const hybrids = (['cornHybridA', 'cornHybridB', 'cornHybridD', 'cornHybridE'] as const).map((k) => catalogue(k, 'corn'));
	return cornLanes.map((l, i) => ({ laneIndex: l.index, variety: hybrids[i], populationPerAcre: 34_000, trialLabel: 'hybrid comparison', ...blank }));
}

export async function seed(knex: Knex) {
	const owner = DEMO_PEOPLE[0];
	const farm = await knex('farms').where({ id: DEMO_FARM_ID }).first('id', 'name', 'units', 'time_zone');
	const access: FarmAccess = {
		user: { id: owner.id, email: `owner@demo.stripwright.test`, name: owner.name },
		farm: { id: farm.id, name: farm.name, units: farm.units, timeZone: farm.time_zone },
		role: 'owner',
		fieldScope: null,
		can: () => true
	};
	try {
		for (const p of plans) {
			for (const [season, offsetFt] of Object.entries(p.offsetBySeason).map(([s, o]) => [Number(s), o] as const)) {
				const exists = await knex('plans').where({ field_id: p.fieldId, season }).whereRaw('lower(variant) = lower(?)', [p.variant]).whereNull('deleted_at').first('id');
				if (exists) continue;
				const base = { guidance: p.guidance, pattern: p.pattern, offsetFt, headlandFt: p.headlandFt, variant: p.variant, notes: null, rebase: false };
				const first = await savePlan(access, p.fieldId, season, { ...base, version: 0, assignments: [] });
				const assignments = p.assignments?.(first.lanes) ?? [];
				if (assignments.length) await savePlan(access, p.fieldId, season, { ...base, version: first.version, assignments });
			}
		}
	} finally {
		await closeDb();
	}
}

// The invented demo scenario, part 2: three fields in southern Minnesota (made-up places), with
// exclusions and one boundary edit kept in the history. Idempotent: fixed ids, insert-if-missing.
import type { Knex } from 'knex';
import type { Polygon } from 'geojson';
import { measureFieldShape, type Exclusion } from '../src/lib/fields/shape';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';

const OWNER = DEMO_PEOPLE[0].id;
const FT = 0.3048;

/** Offsets in feet east/north of an origin to [lng, lat] (local approximation; fine for demo data). */
export function at(origin: [number, number], eastFt: number, northFt: number): [number, number] {
	const [lng, lat] = origin;
	const mPerDegLat = 111_132.92 - 559.82 * Math.cos((2 * lat * Math.PI) / 180);
	const mPerDegLng = 111_412.84 * Math.cos((lat * Math.PI) / 180);
	return [+(lng + (eastFt * FT) / mPerDegLng).toFixed(7), +(lat + (northFt * FT) / mPerDegLat).toFixed(7)];
}

function ring(origin: [number, number], pts: [number, number][]): Polygon {
	const coords = pts.map(([e, n]) => at(origin, e, n));
	return { type: 'Polygon', coordinates: [[...coords, coords[0]]] };
}

export const DEMO_FIELDS = {
	north80: '5a1e0000-0000-4000-8000-0000000001f1',
	wideRow: '5a1e0000-0000-4000-8000-0000000001f2',
	pasture: '5a1e0000-0000-4000-8000-0000000001f3'
} as const;

export const NORTH80_ORIGIN: [number, number] = [-94.2205, 43.9131];
export const WIDE_ORIGIN: [number, number] = [-94.2051, 43.9062];
export const PASTURE_ORIGIN: [number, number] = [-94.2288, 43.9025];

interface DemoField {
	id: string;
	name: string;
	fieldNumber: string;
	landlord: string | null;
	notes: string;
	history: { boundary: Polygon; exclusions: Exclusion[]; reason: string; daysAgo: number }[];
}

export const demoFields: DemoField[] = [
	{
		id: DEMO_FIELDS.north80,
		name: 'North 80',
		fieldNumber: '3',
		landlord: null,
		notes: 'Alternating 8-row corn / 8-row soybean strips on 30-in rows, A-B line north–south.',
		history: [
			{
				// First outline followed the old fence, 30 ft inside the section line on the east.
				boundary: ring(NORTH80_ORIGIN, [[0, 0], [1290, 0], [1290, 2640], [0, 2640]]),
				exclusions: [],
				reason: 'first outline',
				daysAgo: 800
			},
			{
				boundary: ring(NORTH80_ORIGIN, [[0, 0], [1320, 0], [1320, 2640], [0, 2640]]),
				exclusions: [
					{ name: 'Grassed waterway', kind: 'waterway', geometry: ring(NORTH80_ORIGIN, [[500, 0], [560, 0], [760, 1300], [700, 1300]]) }
				],
				reason: 'Old fence removed; boundary moved to the section line. Waterway mapped.',
				daysAgo: 500
			}
		]
	},
	{
		id: DEMO_FIELDS.wideRow,
		name: 'Creek Bend',
		fieldNumber: '7',
		landlord: 'Quinn (demo landlord)',
		notes: 'Wide-row corn (twin rows on 60, 72 and 90-in centres) with a cover mix seeded between the pairs.',
		history: [
			{
				boundary: ring(WIDE_ORIGIN, [[0, 0], [1500, 0], [1650, 900], [1400, 1750], [0, 1600]]),
				exclusions: [{ name: 'Wet spot by the tile outlet', kind: 'wet spot', geometry: ring(WIDE_ORIGIN, [[900, 700], [1100, 700], [1150, 900], [950, 950]]) }],
				reason: 'first outline',
				daysAgo: 790
			}
		]
	},
	{
		id: DEMO_FIELDS.pasture,
		name: 'Shelter Lanes',
		fieldNumber: '12',
		landlord: null,
		notes: 'Crop strips beside pasture lanes grazed by the ewe flock and the feeder pigs in two mobile shelters; hybrid comparison block on the west side; one 30-in check strip.',
		history: [
			{
				boundary: ring(PASTURE_ORIGIN, [[0, 0], [1320, 0], [1320, 1320], [0, 1320]]),
				exclusions: [{ name: 'Shelter staging yard', kind: 'yard', geometry: ring(PASTURE_ORIGIN, [[0, 0], [160, 0], [160, 120], [0, 120]]) }],
				reason: 'first outline',
				daysAgo: 780
			}
		]
	}
];

export async function seed(knex: Knex) {
	for (const f of demoFields) {
		if (await knex('fields').where({ id: f.id }).first('id')) continue;
		const current = f.history[f.history.length - 1];
		const m = measureFieldShape(current);
		await knex.transaction(async (trx) => {
			await trx('fields').insert({
				id: f.id,
				farm_id: DEMO_FARM_ID,
				name: f.name,
				boundary: JSON.stringify(current.boundary),
				exclusions: JSON.stringify(current.exclusions),
				boundary_version: f.history.length,
				acres: m.acres,
				excluded_acres: m.excludedAcres,
				farm_number: '4417',
				tract_number: '1092',
				field_number: f.fieldNumber,
				landlord: f.landlord,
				notes: f.notes,
				version: f.history.length,
				created_by: OWNER
			});
			for (const [i, v] of f.history.entries()) {
				const vm = measureFieldShape(v);
				await trx('field_boundary_versions').insert({
					farm_id: DEMO_FARM_ID,
					field_id: f.id,
					version: i + 1,
					boundary: JSON.stringify(v.boundary),
					exclusions: JSON.stringify(v.exclusions),
					acres: vm.acres,
					excluded_acres: vm.excludedAcres,
					reason: v.reason,
					created_by: OWNER,
					created_at: new Date(Date.now() - v.daysAgo * 86_400_000)
				});
			}
		});
	}
	// The demo landlord (viewer) sees only the field they own.
	await knex('memberships')
		.where({ farm_id: DEMO_FARM_ID, user_id: DEMO_PEOPLE[4].id })
		.whereNull('field_scope')
		.update({ field_scope: [DEMO_FIELDS.wideRow] });
}

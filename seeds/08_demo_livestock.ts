// The invented demo scenario, part 8: a ewe flock and a group of feeder pigs in the two mobile
// shelters on the pasture lanes of Shelter Lanes, a season of moves, a lamb crop and a predator
// loss. Idempotent: fixed ids, insert-if-missing.
import type { Knex } from 'knex';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { DEMO_FIELDS } from './02_demo_fields';
import { laneExtent, stretchOutline } from '../src/lib/livestock/stretch';
import { laneBlocks, blocksDuring } from '../src/lib/livestock/blocks';

const id = (n: number) => `5a1e0000-0000-4000-8000-0000000b${String(n).padStart(4, '0')}`;
export const DEMO_LIVESTOCK = { eweFlock: id(1), feederPigs: id(2) } as const;
const EWE_SHELTER = '5a1e0000-0000-4000-8000-0000000e0006';
const PIG_SHELTER = '5a1e0000-0000-4000-8000-0000000e0007';
const SEASON = 2026;
const OWNER = DEMO_PEOPLE[0].id;
const CREW = DEMO_PEOPLE[2].id;
const DAY = 86_400_000;

// Local midnight in America/Chicago during the grazing season (CDT, UTC−5).
const cdt = (month: number, day: number, hour = 8) => new Date(Date.UTC(SEASON, month - 1, day, hour + 5));

const groups = [
	{ id: DEMO_LIVESTOCK.eweFlock, name: 'Ewe flock', species: 'sheep', head: 38, average_weight_lb: 150, notes: 'Ewes lamb in April on the pasture lanes; lambs sold in October.' },
	{ id: DEMO_LIVESTOCK.feederPigs, name: 'Feeder pigs', species: 'hog', head: 0, average_weight_lb: 140, notes: 'Bought as feeders in May, on pasture with a ration.' }
];

const events = [
	{ id: id(101), group_id: DEMO_LIVESTOCK.eweFlock, kind: 'birth', head: 52, cause: null, occurred_at: cdt(4, 14), notes: 'Lamb crop: 52 lambs from 38 ewes.' },
	{ id: id(102), group_id: DEMO_LIVESTOCK.feederPigs, kind: 'purchase', head: 18, cause: null, occurred_at: cdt(5, 16), notes: 'Feeders bought at about 60 lb.' },
	{ id: id(103), group_id: DEMO_LIVESTOCK.eweFlock, kind: 'loss', head: 3, cause: 'predator', occurred_at: cdt(7, 9, 6), notes: 'Three lambs taken at night at the north end of the lane; fence charger found off.' },
	{ id: id(104), group_id: DEMO_LIVESTOCK.feederPigs, kind: 'death', head: 1, cause: 'weather', occurred_at: cdt(7, 28, 17), notes: 'Heat stress on a 95 °F afternoon; shade and water added to the shelter.' },
	{ id: id(105), group_id: DEMO_LIVESTOCK.eweFlock, kind: 'sale', head: 40, cause: null, occurred_at: cdt(10, 6), notes: 'Market lambs sold.' }
];

interface Plan {
	id: string;
	version: number;
	guidance: { a: [number, number]; b: [number, number] };
}

export async function seed(knex: Knex) {
	if (await knex('livestock_groups').where({ id: DEMO_LIVESTOCK.eweFlock }).first('id')) return;
	const plan: Plan | undefined = await knex('plans').where({ farm_id: DEMO_FARM_ID, field_id: DEMO_FIELDS.pasture, season: SEASON, adopted: true }).whereNull('deleted_at').first('id', 'version', 'guidance');
	if (!plan) return;
	const lanes = await knex('plan_lanes').where({ plan_id: plan.id, kind: 'pasture' }).orderBy('lane_index');
	const farm = await knex('farms').where({ id: DEMO_FARM_ID }).first('time_zone');

	await knex.transaction(async (trx) => {
		for (const g of groups) await trx('livestock_groups').insert({ ...g, farm_id: DEMO_FARM_ID, created_by: OWNER, updated_by: OWNER, created_at: cdt(3, 20) });
		// Events in time order, each keeping the count after it, so the group's head is current.
		const head = new Map(groups.map((g) => [g.id, g.head]));
		for (const e of events) {
			const after = (head.get(e.group_id) ?? 0) + (['birth', 'purchase'].includes(e.kind) ? e.head : -e.head);
			head.set(e.group_id, after);
			await trx('livestock_events').insert({ ...e, farm_id: DEMO_FARM_ID, head_after: after, created_by: CREW, updated_by: CREW, created_at: e.occurred_at });
		}
		for (const [groupId, count] of head) await trx('livestock_groups').where({ id: groupId }).update({ head: count, version: 1 + events.filter((e) => e.group_id === groupId).length });

		// Spraying already on record for the field: moves keep off lanes it closed, as the app would.
		const work = await trx('operations as o')
			.join('operation_lanes as ol', 'ol.operation_id', 'o.id')
			.leftJoin('operation_products as op', 'op.operation_id', 'o.id')
			.where({ 'o.farm_id': DEMO_FARM_ID, 'o.field_id': DEMO_FIELDS.pasture, 'o.season': SEASON })
			.whereNull('o.deleted_at')
			.select('o.type', 'o.started_at', 'o.ended_at', 'ol.lane_index', 'op.product_name', 'op.grazing_days');
		const blocks = laneBlocks(
			lanes.map((l) => l.lane_index),
			work.filter((w) => w.product_name && w.grazing_days != null).map((w) => ({ laneIndex: w.lane_index, productName: w.product_name, startedAt: new Date(w.started_at), endedAt: new Date(w.ended_at), grazingDays: w.grazing_days })),
			work.filter((w) => w.type === 'spraying').map((w) => ({ laneIndex: w.lane_index, startedAt: new Date(w.started_at), endedAt: new Date(w.ended_at) })),
			[],
			farm?.time_zone ?? 'America/Chicago'
		);

		// Ewes: the pasture lane after each corn strip, from the east side, 180 ft every 3 days.
		// Pigs: the lane after each soybean strip, 120 ft a week.
		const plans = [
			{ groupId: DEMO_LIVESTOCK.eweFlock, shelterId: EWE_SHELTER, shelterName: 'Ewe shelter', patternIndex: 1, stepFt: 180, days: 3, first: cdt(5, 4), last: cdt(10, 3), head: [38, 90, 87], weight: 150, forage: 1800, utilization: 0.5, intake: 3.5 },
			{ groupId: DEMO_LIVESTOCK.feederPigs, shelterId: PIG_SHELTER, shelterName: 'Pig shelter', patternIndex: 3, stepFt: 120, days: 7, first: cdt(5, 18), last: cdt(9, 28), head: [18, 18, 17], weight: 140, forage: 1200, utilization: 0.4, intake: 1 }
		];
		let n = 0;
		for (const p of plans) {
			const mine = lanes.filter((l) => l.pattern_index === p.patternIndex).reverse();
			let laneAt = 0;
			let fromFt = 0;
			for (let start = p.first; start < p.last && laneAt < mine.length; start = new Date(start.getTime() + p.days * DAY)) {
				const lane = mine[laneAt];
				const extent = laneExtent(lane.geometry, plan.guidance);
				const toFt = Math.min(extent.lengthFt, fromFt + p.stepFt);
				const end = new Date(start.getTime() + p.days * DAY);
				const headNow = start < cdt(4, 14) ? p.head[0] : start < cdt(7, 9) ? p.head[1] : p.head[2];
				if (blocksDuring(blocks, lane.lane_index, start, end).length === 0) {
					const stretch = stretchOutline(lane.geometry, plan.guidance, fromFt, toFt);
					await trx('grazing_moves').insert({
						id: id(1000 + n++),
						farm_id: DEMO_FARM_ID,
						group_id: p.groupId,
						shelter_id: p.shelterId,
						shelter_name: p.shelterName,
						field_id: DEMO_FIELDS.pasture,
						season: SEASON,
						plan_id: plan.id,
						plan_version: plan.version,
						lane_index: lane.lane_index,
						lane_kind: lane.kind,
						lane_crop: lane.crop,
						lane_acres: lane.acres,
						lane_length_ft: extent.lengthFt,
						lane_geometry: JSON.stringify(lane.geometry),
						from_ft: Math.round(fromFt * 100) / 100,
						to_ft: Math.round(toFt * 100) / 100,
						stretch_geometry: stretch.geometry ? JSON.stringify(stretch.geometry) : null,
						stretch_acres: stretch.acres,
						starts_at: start,
						ends_at: end,
						head: headNow,
						average_weight_lb: p.weight,
						forage_lb_per_acre: p.forage,
						utilization: p.utilization,
						intake_pct: p.intake,
						created_by: CREW,
						updated_by: CREW,
						created_at: start
					});
				}
				fromFt = toFt;
				if (fromFt >= extent.lengthFt - 1) {
					laneAt++;
					fromFt = 0;
				}
			}
		}
	});
}

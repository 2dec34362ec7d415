// The invented demo scenario, part 6: the season record book on the three demo fields — the 2025
// and 2026 seasons from planting to harvest-time sprays, and the fall work already done for 2027.
// Logged through the module the app uses, so lanes, acres, totals and label copies are real; then
// the logging time is set to a plausible day after the work (one restricted-use record is made
// late on purpose, so the book's 14-day flag has something to show). Every name is invented.
import type { Knex } from 'knex';
import { createRecord } from '../src/lib/server/records';
import { closeDb } from '../src/lib/server/db';
import type { FarmAccess } from '../src/lib/server/access';
import type { RecordInput, RecordType } from '../src/lib/schemas/records';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { DEMO_FIELDS } from './02_demo_fields';
import { DEMO_PRODUCTS } from './05_demo_catalog';

type FieldKey = keyof typeof DEMO_FIELDS;
type LanePick = 'corn' | 'soybean' | 'pasture' | 'all' | 'crop';

interface DemoRecord {
	field: FieldKey;
	season: number;
	by: 'owner' | 'manager' | 'crew';
	type: RecordType;
	/** Local clock time at the farm (America/Chicago, with its offset that day). */
	started: string;
	ended: string;
	lanes: LanePick;
	products?: { key: keyof typeof DEMO_PRODUCTS; rate: number; rateUnit: string }[];
	details?: RecordInput['details'];
	weather?: { tempF: number; windMph: number; windFrom: string };
	equipment?: string;
	notes?: string;
	/** Hours after the end of the work at which it was written down. */
	loggedAfterHours?: number;
}

// Invented certification number of the demo owner, a private applicator.
const CERT = 'PA-DEMO-0417';
const OWNER = DEMO_PEOPLE[0];

function seasonOf(year: number): DemoRecord[] {
	const y = String(year);
	return [
		{ field: 'north80', season: year, by: 'crew', type: 'tillage', started: `${y}-04-22T08:00:00-05:00`, ended: `${y}-04-22T15:30:00-05:00`, lanes: 'all', equipment: 'field cultivator, 40 ft', details: { depthIn: 3 } },
		{
			field: 'north80', season: year, by: 'owner', type: 'planting', started: `${y}-05-02T07:30:00-05:00`, ended: `${y}-05-02T18:00:00-05:00`, lanes: 'corn',
			equipment: '8-row planter, 30 in', details: { variety: 'hybrid A (105-day)', populationPerAcre: 34_000, depthIn: 2, seedLot: 'HA-2026-014' },
			products: [{ key: 'starter10340', rate: 5, rateUnit: 'gal/ac' }], weather: { tempF: 61, windMph: 8, windFrom: 'S' }
		},
		{
			field: 'north80', season: year, by: 'owner', type: 'spraying', started: `${y}-05-03T08:00:00-05:00`, ended: `${y}-05-03T11:15:00-05:00`, lanes: 'corn',
			products: [{ key: 'residualHerbicideA', rate: 2, rateUnit: 'pt/ac' }], weather: { tempF: 58, windMph: 6, windFrom: 'NW' }, equipment: 'sprayer, 60-ft boom',
			notes: 'Pre-emergence on the corn lanes only; soybean lanes not yet planted.', loggedAfterHours: year === 2025 ? 20 * 24 : 6
		},
		{
			field: 'north80', season: year, by: 'crew', type: 'planting', started: `${y}-05-10T08:00:00-05:00`, ended: `${y}-05-10T17:00:00-05:00`, lanes: 'soybean',
			equipment: '8-row planter, 30 in', details: { variety: 'soybean line 2.1', populationPerAcre: 140_000, depthIn: 1.5, seedLot: 'SL21-2026-007' }
		},
		{
			field: 'north80', season: year, by: 'crew', type: 'fertilizer', started: `${y}-06-12T07:00:00-05:00`, ended: `${y}-06-12T12:30:00-05:00`, lanes: 'corn',
			products: [{ key: 'uan32', rate: 15, rateUnit: 'gal/ac' }], details: { placement: 'side-dress', analysis: '32-0-0' }, equipment: 'side-dress toolbar, 8 row'
		},
		{
			field: 'north80', season: year, by: 'manager', type: 'spraying', started: `${y}-06-20T07:00:00-05:00`, ended: `${y}-06-20T10:00:00-05:00`, lanes: 'soybean',
			products: [{ key: 'postHerbicideB', rate: 6, rateUnit: 'fl oz/ac' }], weather: { tempF: 74, windMph: 5, windFrom: 'SW' }, equipment: 'sprayer, 60-ft boom'
		},
		{
			field: 'north80', season: year, by: 'manager', type: 'spraying', started: `${y}-07-24T17:00:00-05:00`, ended: `${y}-07-24T19:30:00-05:00`, lanes: 'corn',
			products: [{ key: 'fungicideD', rate: 6, rateUnit: 'fl oz/ac' }], weather: { tempF: 81, windMph: 7, windFrom: 'S' }, notes: 'Leaf disease seen on lower leaves while scouting.'
		},
		{
			field: 'north80', season: year, by: 'owner', type: 'spraying', started: `${y}-08-05T07:00:00-05:00`, ended: `${y}-08-05T09:30:00-05:00`, lanes: 'soybean',
			products: [{ key: 'insecticideC', rate: 3.2, rateUnit: 'fl oz/ac' }], weather: { tempF: 70, windMph: 4, windFrom: 'E' }, equipment: 'sprayer, 60-ft boom',
			notes: 'Aphid counts above the threshold the advisor uses.'
		},
		{
			field: 'wideRow', season: year, by: 'owner', type: 'planting', started: `${y}-05-05T08:00:00-05:00`, ended: `${y}-05-05T16:00:00-05:00`, lanes: 'all',
			details: { variety: 'hybrid C (102-day)', populationPerAcre: 32_000, depthIn: 2 }, equipment: 'twin-row planter'
		},
		{
			field: 'wideRow', season: year, by: 'crew', type: 'cover-seeding', started: `${y}-06-15T09:00:00-05:00`, ended: `${y}-06-15T15:00:00-05:00`, lanes: 'all',
			products: [{ key: 'coverMix', rate: 52, rateUnit: 'lb/ac' }],
			details: { method: 'interseeded', species: [{ species: 'cereal rye', rateLbPerAcre: 40 }, { species: 'crimson clover', rateLbPerAcre: 12 }] }, equipment: 'interseeder between the twin rows'
		},
		{
			field: 'pasture', season: year, by: 'crew', type: 'planting', started: `${y}-05-06T08:00:00-05:00`, ended: `${y}-05-06T13:00:00-05:00`, lanes: 'corn',
			details: { variety: 'hybrid A (105-day)', populationPerAcre: 34_000, depthIn: 2 }, notes: 'Hybrid comparison block on the first four corn lanes, as on the seeding sheet.'
		},
		{
			field: 'pasture', season: year, by: 'crew', type: 'planting', started: `${y}-05-11T08:00:00-05:00`, ended: `${y}-05-11T12:00:00-05:00`, lanes: 'soybean',
			details: { variety: 'soybean line 2.1', populationPerAcre: 140_000, depthIn: 1.5 }
		},
		{
			field: 'pasture', season: year, by: 'manager', type: 'spraying', started: `${y}-06-22T07:30:00-05:00`, ended: `${y}-06-22T09:00:00-05:00`, lanes: 'soybean',
			products: [{ key: 'postHerbicideB', rate: 6, rateUnit: 'fl oz/ac' }], weather: { tempF: 72, windMph: 4, windFrom: 'N' },
			notes: 'Flock kept off the neighbouring pasture lanes for the day of spraying (drift).'
		},
		{ field: 'pasture', season: year, by: 'crew', type: 'mowing', started: `${y}-07-08T09:00:00-05:00`, ended: `${y}-07-08T11:00:00-05:00`, lanes: 'pasture', details: { heightIn: 4 } }
	];
}

const FALL_FOR_2027: DemoRecord[] = [
	{ field: 'north80', season: 2027, by: 'crew', type: 'tillage', started: '2026-11-05T08:00:00-06:00', ended: '2026-11-05T15:00:00-06:00', lanes: 'corn', equipment: 'strip-till bar, 8 row', details: { depthIn: 7 }, notes: 'Fall strip-till on next season\'s corn lanes.' },
	{
		field: 'north80', season: 2027, by: 'crew', type: 'fertilizer', started: '2026-11-06T08:00:00-06:00', ended: '2026-11-06T12:00:00-06:00', lanes: 'corn',
		products: [{ key: 'starter10340', rate: 8, rateUnit: 'gal/ac' }], details: { placement: 'banded', analysis: '10-34-0' }, notes: 'Phosphorus banded in the strip-till zone.'
	}
];

export async function seed(knex: Knex) {
	const farm = await knex('farms').where({ id: DEMO_FARM_ID }).first('id', 'name', 'units', 'time_zone');
	if (!farm) return;
	// Idempotent: the demo book is written once.
	if (await knex('operations').where({ farm_id: DEMO_FARM_ID }).first('id')) return;
	const accessFor = (by: DemoRecord['by']): FarmAccess => {
		const person = DEMO_PEOPLE.find((p) => p.role === by)!;
		return {
			user: { id: person.id, email: `${by}@demo.stripwright.test`, name: person.name },
			farm: { id: farm.id, name: farm.name, units: farm.units, timeZone: farm.time_zone },
			role: by,
			fieldScope: null,
			sees: { memberEmails: true, equipment: true },
			can: () => true
		};
	};
	const now = Date.now();
	try {
		for (const r of [...seasonOf(2025), ...seasonOf(2026), ...FALL_FOR_2027]) {
			if (new Date(r.ended).getTime() > now) continue; // a clock set before the demo dates
			const plan = await knex('plans').where({ field_id: DEMO_FIELDS[r.field], season: r.season, adopted: true }).whereNull('deleted_at').first('id');
			if (!plan) continue;
			const lanes = await knex('plan_lanes').where({ plan_id: plan.id }).orderBy('lane_index').select('lane_index', 'kind', 'crop');
			const laneIndexes = lanes
				.filter((l) => (r.lanes === 'all' ? l.kind === 'crop' : r.lanes === 'crop' ? l.kind === 'crop' : r.lanes === 'pasture' ? l.kind === 'pasture' : l.crop === r.lanes))
				.map((l) => l.lane_index as number);
			if (!laneIndexes.length) continue;
			const products = (r.products ?? []).map((p) => ({ productId: DEMO_PRODUCTS[p.key], rate: p.rate, rateUnit: p.rateUnit }));
			const restricted = r.products?.some((p) => p.key === 'residualHerbicideA' || p.key === 'insecticideC');
			const { record } = await createRecord(accessFor(r.by), DEMO_FIELDS[r.field], r.season, {
				type: r.type,
				startedAt: r.started,
				endedAt: r.ended,
				laneIndexes,
				products,
				applicator: products.length ? OWNER.name : null,
				applicatorCertNumber: restricted ? CERT : null,
				equipment: r.equipment ?? null,
				weather: r.weather ?? null,
				details: r.details ?? null,
				notes: r.notes ?? null
			});
			// Written down some hours after the work, as people do.
			const logged = new Date(new Date(r.ended).getTime() + (r.loggedAfterHours ?? 3) * 3_600_000);
			await knex('operations').where({ id: record.id }).update({ created_at: logged, updated_at: logged, rup_completed_at: record.restrictedUse ? logged : null });
			await knex('audit_log').where({ entity: 'record', entity_id: record.id }).update({ at: logged });
		}
	} finally {
		await closeDb();
	}
}

// The invented demo scenario, part 7: scouting notes on the demo fields for 2025 and 2026 (one with
// a photo drawn here, stored through the app's file store) and two rain gauges with daily readings
// for the 2024–2026 seasons. Written through the app's modules where a note needs its lane placed.
// Every observation and every number is invented. Idempotent: skipped when the demo has notes.
import type { Knex } from 'knex';
import sharp from 'sharp';
import { createScoutingNote } from '../src/lib/server/scouting';
import { closeDb } from '../src/lib/server/db';
import type { FarmAccess } from '../src/lib/server/access';
import type { ScoutingNoteInput } from '../src/lib/schemas/scouting';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { at, DEMO_FIELDS, NORTH80_ORIGIN, WIDE_ORIGIN } from './02_demo_fields';

export const DEMO_GAUGES = {
	north80: '5a1e0000-0000-4000-8000-0000000007a1',
	east: '5a1e0000-0000-4000-8000-0000000007a2'
};

type FieldKey = keyof typeof DEMO_FIELDS;

interface DemoNote {
	field: FieldKey;
	season: number;
	by: 'advisor' | 'crew' | 'manager';
	crop: string;
	/** Which lane of that crop (0 = the first from the left). */
	nth: number;
	positionFt: number;
	observedAt: string;
	input: Omit<ScoutingNoteInput, 'laneIndex' | 'positionFt' | 'observedAt' | 'location'>;
	photo?: boolean;
}

const blank = { growthStage: null, pests: null, diseases: null, weeds: null, notes: null, standCount: null };

const NOTES: DemoNote[] = [
	{ field: 'north80', season: 2025, by: 'advisor', crop: 'corn', nth: 2, positionFt: 600, observedAt: '2025-06-05T10:15:00-05:00', input: { ...blank, growthStage: 'V4', standCount: { plantsCounted: 33 }, notes: 'Even emergence; a few skips where the planter crossed the waterway.' } },
	{ field: 'north80', season: 2025, by: 'advisor', crop: 'soybean', nth: 3, positionFt: 1800, observedAt: '2025-07-22T15:40:00-05:00', input: { ...blank, growthStage: 'R2', pests: 'Leaf-feeding beetles, about 10 % defoliation on the border rows.', weeds: 'Scattered waterhemp above the canopy.' } },
	{ field: 'wideRow', season: 2025, by: 'crew', crop: 'corn', nth: 5, positionFt: 400, observedAt: '2025-06-18T08:30:00-05:00', input: { ...blank, growthStage: 'V7', notes: 'Cover mix between the twin rows is up and even; clover patchy by the wet spot.' } },
	{ field: 'north80', season: 2026, by: 'advisor', crop: 'corn', nth: 4, positionFt: 900, observedAt: '2026-06-09T09:30:00-05:00', photo: true, input: { ...blank, growthStage: 'V6', standCount: { plantsCounted: 32 }, diseases: 'None seen.', weeds: 'Grass escapes in the first 50 ft of the headland.', notes: 'Stand check after the cold snap: plants recovered; outside rows look greener than the middle ones.' } },
	{ field: 'north80', season: 2026, by: 'advisor', crop: 'soybean', nth: 1, positionFt: 1500, observedAt: '2026-07-14T16:05:00-05:00', input: { ...blank, growthStage: 'R1', pests: 'Aphids on a few plants, well under any action level.', standCount: { plantsCounted: 118 } } },
	{ field: 'pasture', season: 2026, by: 'manager', crop: 'corn', nth: 0, positionFt: 700, observedAt: '2026-07-02T11:20:00-05:00', input: { ...blank, growthStage: 'V12', notes: 'Hybrid comparison block: the first lane is visibly shorter; check again at tasseling.' } },
	{ field: 'wideRow', season: 2026, by: 'advisor', crop: 'corn', nth: 3, positionFt: 500, observedAt: '2026-06-24T10:00:00-05:00', input: { ...blank, growthStage: 'V9', diseases: 'Grey leaf spot lesions on lower leaves of the 30-in check strip only.', standCount: { plantsCounted: 31, rowSpacingIn: 30 } } }
];

/** A small invented field photo: rows of green leaves on brown soil (no camera, no location). */
async function demoPhoto(): Promise<Uint8Array> {
	const leaves = Array.from({ length: 6 }, (_, row) =>
		Array.from({ length: 8 }, (_, i) => `<ellipse cx="${60 + i * 95}" cy="${70 + row * 95}" rx="34" ry="12" transform="rotate(${(i * 37 + row * 21) % 180} ${60 + i * 95} ${70 + row * 95})" fill="#3f7d20"/>`).join('')
	).join('');
	const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600"><rect width="800" height="600" fill="#6b4f2c"/>${leaves}</svg>`;
	return new Uint8Array(await sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer());
}

/** A repeatable sequence of numbers in [0, 1): the same demo rain on every machine. */
function seeded(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Invented daily rain for April–October: about one day in four wet, mostly light, a few storms. */
function demoRain(year: number, gauge: number, today: string): { date: string; inches: number }[] {
	const random = seeded(year * 10 + gauge);
	const out: { date: string; inches: number }[] = [];
	for (let d = new Date(Date.UTC(year, 3, 1)); d.getUTCMonth() <= 9; d.setUTCDate(d.getUTCDate() + 1)) {
		const date = d.toISOString().slice(0, 10);
		if (date > today) break;
		const r = random();
		if (r > 0.26) continue;
		const size = random();
		const inches = size < 0.6 ? 0.02 + size * 0.5 : size < 0.93 ? 0.3 + (size - 0.6) * 3 : 1.3 + (size - 0.93) * 25;
		out.push({ date, inches: Math.round(inches * 100) / 100 });
	}
	return out;
}

export async function seed(knex: Knex) {
	const farm = await knex('farms').where({ id: DEMO_FARM_ID }).first('id', 'name', 'units', 'time_zone');
	if (!farm) return;
	const person = (role: string) => DEMO_PEOPLE.find((p) => p.role === role)!;
	const accessFor = (role: DemoNote['by']): FarmAccess => ({
		user: { id: person(role).id, email: `${role}@demo.stripwright.test`, name: person(role).name },
		farm: { id: farm.id, name: farm.name, units: farm.units, timeZone: farm.time_zone },
		role,
		fieldScope: null,
		sees: { memberEmails: true, equipment: true },
		can: () => true
	});

	// Rain gauges and readings.
	const crew = person('crew').id;
	await knex('rain_gauges')
		.insert([
			{ id: DEMO_GAUGES.north80, farm_id: DEMO_FARM_ID, name: 'North 80 gauge', field_id: DEMO_FIELDS.north80, location: JSON.stringify({ type: 'Point', coordinates: at(NORTH80_ORIGIN, -40, 1320) }), notes: 'On the fence post by the field entrance.', created_by: person('manager').id },
			{ id: DEMO_GAUGES.east, farm_id: DEMO_FARM_ID, name: 'East gauge', field_id: DEMO_FIELDS.wideRow, location: JSON.stringify({ type: 'Point', coordinates: at(WIDE_ORIGIN, 1560, 450) }), created_by: person('manager').id }
		])
		.onConflict('id')
		.ignore();
	if (!(await knex('rainfall_readings').where({ farm_id: DEMO_FARM_ID }).first('id'))) {
		const today = new Date().toISOString().slice(0, 10);
		const rows = [];
		for (const year of [2024, 2025, 2026]) {
			for (const [n, gaugeId] of [DEMO_GAUGES.north80, DEMO_GAUGES.east].entries()) {
				for (const r of demoRain(year, n, today)) rows.push({ farm_id: DEMO_FARM_ID, gauge_id: gaugeId, reading_date: r.date, inches: r.inches, created_by: crew, updated_by: crew });
			}
		}
		for (let i = 0; i < rows.length; i += 500) await knex('rainfall_readings').insert(rows.slice(i, i + 500));
	}

	// Scouting notes.
	if (await knex('scouting_notes').where({ farm_id: DEMO_FARM_ID }).first('id')) return;
	const now = Date.now();
	try {
		for (const n of NOTES) {
			if (new Date(n.observedAt).getTime() > now) continue;
			const plan = await knex('plans').where({ field_id: DEMO_FIELDS[n.field], season: n.season, adopted: true }).whereNull('deleted_at').first('id');
			if (!plan) continue;
			const lanes = await knex('plan_lanes').where({ plan_id: plan.id, crop: n.crop }).orderBy('lane_index').select('lane_index');
			const lane = lanes[Math.min(n.nth, lanes.length - 1)];
			if (!lane) continue;
			const photos = n.photo ? [{ name: 'stand-check-v6.jpg', bytes: await demoPhoto() }] : [];
			await createScoutingNote(accessFor(n.by), DEMO_FIELDS[n.field], n.season, { ...n.input, laneIndex: lane.lane_index, positionFt: n.positionFt, observedAt: n.observedAt }, photos);
		}
	} finally {
		await closeDb();
	}
}

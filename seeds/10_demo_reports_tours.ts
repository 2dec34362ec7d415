// The invented demo scenario: a summer field day walking all three demo fields, with three stops.
// Its share link uses a fixed demo token so the demo can be opened at once:
//   /share/demo-summer-field-day-2027-strips-and-lanes
// (a real tour's token is random and shown only once; only its hash is ever stored).
import type { Knex } from 'knex';
import { hashToken } from '../src/lib/server/tours';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { at, DEMO_FIELDS, NORTH80_ORIGIN, PASTURE_ORIGIN, WIDE_ORIGIN } from './02_demo_fields';

export const DEMO_TOUR_TOKEN = 'demo-summer-field-day-2027-strips-and-lanes';
const DEMO_TOUR_ID = '5a1e0000-0000-4000-8000-0000000007a1';

const stops = [
	{ point: at(NORTH80_ORIGIN, 300, 1300), title: 'Eight-row strips', note: 'Corn and soybean in 8-row strips on 30-in rows. Look at the outside corn rows next to the soybean: more light, bigger ears.' },
	{ point: at(WIDE_ORIGIN, 400, 800), title: 'Twin rows on wide centres', note: 'Twin corn rows on 60, 72 and 90-in centres with a cover mix growing between them, and a 30-in check strip for comparison.' },
	{ point: at(PASTURE_ORIGIN, 300, 700), title: 'Grazing lanes', note: 'Sheep and pigs move through the pasture lanes in mobile shelters. Please stay outside the fence and do not feed the animals.' }
];

export async function seed(knex: Knex) {
	if (await knex('tours').where({ id: DEMO_TOUR_ID }).first('id')) return;
	await knex.transaction(async (trx) => {
		await trx('tours').insert({
			id: DEMO_TOUR_ID,
			farm_id: DEMO_FARM_ID,
			title: 'Summer field day: strips, twin rows and grazing lanes',
			tour_date: '2027-07-15',
			expires_at: '2027-07-31T23:00:00-05:00',
			token_hash: hashToken(DEMO_TOUR_TOKEN),
			field_ids: [DEMO_FIELDS.north80, DEMO_FIELDS.wideRow, DEMO_FIELDS.pasture],
			created_by: DEMO_PEOPLE[1].id
		});
		await trx('tour_stops').insert(
			stops.map((s, position) => ({ farm_id: DEMO_FARM_ID, tour_id: DEMO_TOUR_ID, position, lng: s.point[0], lat: s.point[1], title: s.title, note: s.note }))
		);
	});
}

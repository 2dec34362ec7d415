import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import * as gaugesRoute from '../../src/routes/api/farms/[farmId]/rainfall/gauges/+server';
import * as gaugeRoute from '../../src/routes/api/farms/[farmId]/rainfall/gauges/[gaugeId]/+server';
import * as readingsRoute from '../../src/routes/api/farms/[farmId]/rainfall/readings/+server';
import * as readingRoute from '../../src/routes/api/farms/[farmId]/rainfall/readings/[readingId]/+server';
import * as seasonRoute from '../../src/routes/api/farms/[farmId]/rainfall/seasons/[season]/+server';
import { makeUser } from './helpers';
import { call, farmWithPlan } from './scouting-setup';

async function farmWithGauges() {
	const s = await farmWithPlan();
	const p = { farmId: s.farm.id };
	const east = await call(gaugesRoute.POST, s.members.owner, p, { method: 'POST', json: { name: 'East gauge', location: { lng: -94.205, lat: 43.902 }, fieldId: s.field.id } });
	const yard = await call(gaugesRoute.POST, s.members.manager, p, { method: 'POST', json: { name: 'Yard gauge', location: { lng: -94.22, lat: 43.899 } } });
	expect(east.status).toBe(201);
	expect(yard.status).toBe(201);
	return { ...s, p, east: east.body, yard: yard.body };
}

const post = (json: unknown) => ({ method: 'POST', json });

describe('rain gauges and readings', () => {
	it('totals each gauge over the season and sums weeks Monday to Sunday on the farm\'s calendar', async () => {
		const s = await farmWithGauges();
		expect(s.east).toMatchObject({ name: 'East gauge', location: { lng: -94.205, lat: 43.902 }, fieldId: s.field.id, fieldName: 'Scouting test', version: 1 });
		const readings: [string, Record<string, unknown>][] = [
			[s.east.id, { date: '2026-05-29', inches: 0.4 }],
			// 03:00 UTC on 1 June is 22:00 on 31 May in America/Chicago: a Sunday, the week before.
			[s.east.id, { readAt: '2026-06-01T03:00:00Z', inches: 1.15 }],
			[s.east.id, { date: '2026-06-01', inches: 0.3 }],
			[s.yard.id, { date: '2026-06-02', inches: 0.25 }],
			[s.east.id, { date: '2026-06-16', inches: 0.05 }],
			[s.east.id, { date: '2025-09-01', inches: 2 }] // last season: not in 2026's totals
		];
		for (const [gaugeId, r] of readings) {
			const res = await call(readingsRoute.POST, s.members.crew, s.p, post({ gaugeId, ...r }));
			expect(res.status, JSON.stringify(r)).toBe(201);
		}
		const sunday = await call(readingsRoute.GET, s.members.crew, s.p, { query: `season=2026&gaugeId=${s.east.id}` });
		expect(sunday.body.readings.map((r: { date: string; inches: number }) => [r.date, r.inches])).toEqual([
			['2026-05-29', 0.4],
			['2026-05-31', 1.15],
			['2026-06-01', 0.3],
			['2026-06-16', 0.05]
		]);

		const season = await call(seasonRoute.GET, s.members.advisor, { ...s.p, season: '2026' });
		expect(season.status).toBe(200);
		expect(season.body.timeZone).toBe('America/Chicago');
		expect(season.body.gauges.map((g: { name: string; total: unknown }) => [g.name, g.total])).toEqual([
			['East gauge', { gaugeId: s.east.id, inches: 1.9, readings: 4, wettestDay: { date: '2026-05-31', inches: 1.15 } }],
			['Yard gauge', { gaugeId: s.yard.id, inches: 0.25, readings: 1, wettestDay: { date: '2026-06-02', inches: 0.25 } }]
		]);
		expect(season.body.weeks).toEqual([
			{ weekStart: '2026-05-25', weekEnd: '2026-05-31', byGauge: { [s.east.id]: 1.55, [s.yard.id]: 0 } },
			{ weekStart: '2026-06-01', weekEnd: '2026-06-07', byGauge: { [s.east.id]: 0.3, [s.yard.id]: 0.25 } },
			{ weekStart: '2026-06-08', weekEnd: '2026-06-14', byGauge: { [s.east.id]: 0, [s.yard.id]: 0 } },
			{ weekStart: '2026-06-15', weekEnd: '2026-06-21', byGauge: { [s.east.id]: 0.05, [s.yard.id]: 0 } }
		]);
	});

	it('reads the moment of a reading on the farm\'s own clock, whatever the server\'s zone', async () => {
		const s = await farmWithGauges();
		await db()('farms').where({ id: s.farm.id }).update({ time_zone: 'Pacific/Auckland' });
		// 03:00 UTC on 1 June is 15:00 on 1 June in Auckland.
		const res = await call(readingsRoute.POST, s.members.crew, s.p, post({ gaugeId: s.yard.id, readAt: '2026-06-01T03:00:00Z', inches: 0.5 }));
		expect(res.body.date).toBe('2026-06-01');
		const late = await call(readingsRoute.POST, s.members.crew, s.p, post({ gaugeId: s.yard.id, readAt: '2026-06-01T12:30:00Z', inches: 0.1 }));
		expect(late.body.date).toBe('2026-06-02'); // 00:30 the next day in Auckland
	});

	it('refuses impossible readings, warns on implausible ones, and answers 409 for a second reading of a day', async () => {
		const s = await farmWithGauges();
		const other = await farmWithGauges();
		const bad: [Record<string, unknown>, string][] = [
			[{ gaugeId: s.east.id, date: '2026-06-01', inches: -0.2 }, 'inches'],
			[{ gaugeId: s.east.id, date: '2026-06-01', inches: 46 }, 'inches'],
			[{ gaugeId: s.east.id, date: '2026-06-01', inches: 0.123 }, 'inches'],
			[{ gaugeId: s.east.id, date: '2026-02-30', inches: 0.2 }, 'date'],
			[{ gaugeId: s.east.id, inches: 0.2 }, 'date'],
			[{ gaugeId: s.east.id, date: '2999-06-01', inches: 0.2 }, 'date'],
			[{ gaugeId: other.east.id, date: '2026-06-01', inches: 0.2 }, 'gaugeId'],
			[{ gaugeId: 'east', date: '2026-06-01', inches: 0.2 }, 'gaugeId']
		];
		for (const [json, field] of bad) {
			const res = await call(readingsRoute.POST, s.members.owner, s.p, post(json));
			expect(res.status, JSON.stringify(json)).toBe(400);
			expect(Object.keys(res.body.error.fields), JSON.stringify(json)).toEqual([field]);
		}
		expect((await call(readingsRoute.POST, s.members.owner, s.p, post(bad[5][0]))).body.error.message).toBe('A reading records rain that has fallen: its day cannot be after today.');
		expect(await db()('rainfall_readings').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });

		const heavy = await call(readingsRoute.POST, s.members.owner, s.p, post({ gaugeId: s.east.id, date: '2026-06-01', inches: 12 }));
		expect(heavy.status).toBe(201);
		expect(heavy.body.warnings).toEqual(['12 in in one day is far above a usual heavy rain (over 10 in); it was kept — check the gauge and the decimal point.']);
		const again = await call(readingsRoute.POST, s.members.crew, s.p, post({ gaugeId: s.east.id, date: '2026-06-01', inches: 1.2 }));
		expect(again.status).toBe(409);
		expect(again.body.error).toMatchObject({ code: 'already_recorded', message: 'East gauge already has 12 in for 2026-06-01; edit that reading instead.' });

		const fixed = await call(readingRoute.PATCH, s.members.crew, { ...s.p, readingId: heavy.body.id }, { method: 'PATCH', json: { version: 1, inches: 1.2 } });
		expect(fixed.status).toBe(200);
		expect(fixed.body).toMatchObject({ inches: 1.2, version: 2, warnings: [] });
		const stale = await call(readingRoute.PATCH, s.members.manager, { ...s.p, readingId: heavy.body.id }, { method: 'PATCH', json: { version: 1, inches: 9 } });
		expect(stale.status).toBe(409);
		const audit = await db()('audit_log').where({ entity: 'rainfall_reading', entity_id: heavy.body.id }).orderBy('id');
		expect(audit.map((a) => [a.action, a.before?.inches ?? null, a.after?.inches ?? null])).toEqual([['create', null, 12], ['update', 12, 1.2]]);

		expect((await call(readingRoute.DELETE, s.members.crew, { ...s.p, readingId: heavy.body.id }, { method: 'DELETE' })).status).toBe(204);
		// Once deleted, the day can be recorded again.
		expect((await call(readingsRoute.POST, s.members.crew, s.p, post({ gaugeId: s.east.id, date: '2026-06-01', inches: 1.25 }))).status).toBe(201);

		const dupName = await call(gaugesRoute.POST, s.members.owner, s.p, post({ name: 'east GAUGE', location: { lng: -94.2, lat: 43.9 } }));
		expect(dupName.status).toBe(400);
		expect(dupName.body.error.fields).toEqual({ name: ['This farm already has a rain gauge named east GAUGE.'] });
		const foreignField = await call(gaugesRoute.POST, s.members.owner, s.p, post({ name: 'Far gauge', location: { lng: -94.2, lat: 43.9 }, fieldId: other.field.id }));
		expect(foreignField.status).toBe(400);
		expect(foreignField.body.error.fields).toEqual({ fieldId: ["Choose one of this farm's fields, or none."] });
	});

	it('roles: gauges by owners and managers, readings by owners, managers and crew; viewers read their fields\' gauges; other farms 404', async () => {
		const s = await farmWithGauges();
		const other = await farmWithGauges();
		const gauge = { name: 'West gauge', location: { lng: -94.21, lat: 43.9 } };
		for (const role of ['crew', 'advisor', 'viewer'] as const) {
			const res = await call(gaugesRoute.POST, s.members[role], s.p, post(gauge));
			expect(res.status, role).toBe(403);
		}
		expect((await call(gaugeRoute.PATCH, s.members.crew, { ...s.p, gaugeId: s.yard.id }, { method: 'PATCH', json: { version: 1, name: 'X' } })).status).toBe(403);
		const reading = (date: string) => post({ gaugeId: s.yard.id, date, inches: 0.2 });
		expect((await call(readingsRoute.POST, s.members.owner, s.p, reading('2026-06-01'))).status).toBe(201);
		expect((await call(readingsRoute.POST, s.members.manager, s.p, reading('2026-06-02'))).status).toBe(201);
		expect((await call(readingsRoute.POST, s.members.crew, s.p, reading('2026-06-03'))).status).toBe(201);
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await call(readingsRoute.POST, s.members[role], s.p, reading('2026-06-04'));
			expect(res.status, role).toBe(403);
			expect(res.body.error.code).toBe('forbidden');
		}

		// A viewer granted the field sees its gauge only, not the yard gauge tied to no field.
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const seen = await call(gaugesRoute.GET, s.members.viewer, s.p);
		expect(seen.body.gauges.map((g: { name: string }) => g.name)).toEqual(['East gauge']);
		const seenReadings = await call(readingsRoute.GET, s.members.viewer, s.p, { query: 'season=2026' });
		expect(seenReadings.body.readings).toEqual([]);

		// Another farm: its members and strangers get 404; its gauges cannot be edited from here.
		const stranger = await makeUser('stranger');
		expect((await call(gaugesRoute.GET, stranger, s.p)).status).toBe(404);
		expect((await call(seasonRoute.GET, other.members.owner, { ...s.p, season: '2026' })).status).toBe(404);
		expect((await call(gaugeRoute.PATCH, s.members.owner, { ...s.p, gaugeId: other.yard.id }, { method: 'PATCH', json: { version: 1, name: 'Mine now' } })).status).toBe(404);
		expect((await call(gaugeRoute.DELETE, s.members.owner, { ...s.p, gaugeId: other.yard.id }, { method: 'DELETE' })).status).toBe(404);
		const theirReading = await call(readingsRoute.POST, other.members.crew, { farmId: other.farm.id }, post({ gaugeId: other.yard.id, date: '2026-06-01', inches: 0.3 }));
		expect((await call(readingRoute.DELETE, s.members.owner, { ...s.p, readingId: theirReading.body.id }, { method: 'DELETE' })).status).toBe(404);
		expect((await call(readingsRoute.GET, s.members.owner, s.p, { query: 'season=26' })).status).toBe(400);
	});
});

// When people, the combine and animals may go back onto each lane: REI in elapsed hours from the end
// of the application (40 CFR 170, Worker Protection Standard), PHI and grazing intervals in calendar
// days in the farm's time zone (the product label; NPIC), the longest of several products.
// The farm here keeps America/Chicago; the suite also passes with the process in TZ=Pacific/Auckland.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { call, recordFarm, routes } from './records-setup';

const { listRoute, restrictionsRoute } = routes;
const SEASON = 2026;

async function sprayed(endedAt: string, productIds: string[], laneIndexes = [0, 2], startedAt?: string) {
	const s = await recordFarm(SEASON);
	const res = await log(s, endedAt, productIds.map((k) => s.products[k as keyof typeof s.products]), laneIndexes, startedAt);
	expect(res.status, JSON.stringify(res.body)).toBe(201);
	return s;
}

async function log(s: Awaited<ReturnType<typeof recordFarm>>, endedAt: string, productIds: string[], laneIndexes: number[], startedAt?: string) {
	return call(listRoute.POST, s.members.owner, s.params, {
		method: 'POST',
		json: {
			type: 'spraying',
			startedAt: startedAt ?? new Date(new Date(endedAt).getTime() - 3_600_000).toISOString(),
			endedAt,
			laneIndexes,
			applicator: 'A. Applicator',
			applicatorCertNumber: 'PA-0001',
			products: productIds.map((productId) => ({ productId, rate: 2, rateUnit: 'pt/ac' }))
		}
	});
}

const at = (s: Awaited<ReturnType<typeof recordFarm>>, when: string) => call(restrictionsRoute.GET, s.members.advisor, s.params, { query: `at=${encodeURIComponent(when)}` });

describe('lane restrictions', () => {
	it('counts REI in elapsed hours across the spring clock change, PHI and grazing in Chicago calendar days', async () => {
		// Sprayed until 20:00 CST on Saturday 7 March 2026; clocks go forward at 02:00 on 8 March.
		const s = await sprayed('2026-03-07T20:00:00-06:00', ['herbicide']);
		const res = await at(s, '2026-03-08T03:00:00Z');
		expect(res.status).toBe(200);
		expect(res.body.lanes).toHaveLength(33); // every lane of the plan
		expect(res.body.lanes[0]).toEqual({
			laneIndex: 0,
			// 12 real hours: 14:00Z is 09:00 CDT, not 08:00 — the clock jumped.
			reentryAt: '2026-03-08T14:00:00.000Z',
			// 30 calendar days: 20:00 CDT on 6 April = 01:00Z on 7 April.
			harvestAt: '2026-04-07T01:00:00.000Z',
			// 14 calendar days: 20:00 CDT on 21 March.
			grazingAt: '2026-03-22T01:00:00.000Z'
		});
		expect(res.body.lanes[2].reentryAt).toBe('2026-03-08T14:00:00.000Z');
		expect(res.body.lanes[1]).toEqual({ laneIndex: 1, reentryAt: null, harvestAt: null, grazingAt: null });
		expect(res.body.timeZone).toBe('America/Chicago');
	});

	it('a restriction that has ended is null; one not yet begun (work ended after `at`) does not count', async () => {
		const s = await sprayed('2026-03-07T20:00:00-06:00', ['herbicide']);
		expect((await at(s, '2026-03-08T13:59:59Z')).body.lanes[0].reentryAt).toBe('2026-03-08T14:00:00.000Z');
		const after = (await at(s, '2026-03-08T14:00:00Z')).body.lanes[0];
		expect(after).toEqual({ laneIndex: 0, reentryAt: null, harvestAt: '2026-04-07T01:00:00.000Z', grazingAt: '2026-03-22T01:00:00.000Z' });
		expect((await at(s, '2026-03-08T01:59:00Z')).body.lanes[0]).toEqual({ laneIndex: 0, reentryAt: null, harvestAt: null, grazingAt: null });
		expect((await at(s, '2026-04-07T01:00:00Z')).body.lanes[0]).toEqual({ laneIndex: 0, reentryAt: null, harvestAt: null, grazingAt: null });
	});

	it('counts calendar days across a month end and the autumn clock change', async () => {
		// 18:00 CDT on Saturday 31 October 2026; clocks go back at 02:00 on 1 November.
		const s = await sprayed('2026-10-31T18:00:00-05:00', ['herbicide']);
		const lane = (await at(s, '2026-10-31T23:30:00Z')).body.lanes[0];
		// 12 real hours: 11:00Z on 1 November = 05:00 CST.
		expect(lane.reentryAt).toBe('2026-11-01T11:00:00.000Z');
		// 30 calendar days: 18:00 CST on 30 November = 00:00Z on 1 December.
		expect(lane.harvestAt).toBe('2026-12-01T00:00:00.000Z');
		// 14 calendar days: 18:00 CST on 14 November.
		expect(lane.grazingAt).toBe('2026-11-15T00:00:00.000Z');
	});

	it('takes the longest of several products and of several records, each from its own end', async () => {
		// herbicide: REI 12 h, PHI 30 d, grazing 14 d; insecticide C: REI 48 h, PHI 21 d, grazing 30 d.
		const s = await sprayed('2026-07-01T14:00:00-05:00', ['herbicide', 'rup']);
		const lane = (await at(s, '2026-07-01T20:00:00Z')).body.lanes[0];
		expect(lane).toEqual({
			laneIndex: 0,
			reentryAt: '2026-07-03T19:00:00.000Z', // 48 h
			harvestAt: '2026-07-31T19:00:00.000Z', // 30 days (applied 1 July → harvest from 31 July)
			grazingAt: '2026-07-31T19:00:00.000Z' // 30 days
		});
		// A fungicide (REI 24 h, PHI 7 d) on lane 1 two days later: re-entry moves, harvest stays.
		const later = await log(s, '2026-07-03T10:00:00-05:00', [s.products.fungicide], [0]);
		expect(later.status).toBe(201);
		const both = (await at(s, '2026-07-03T16:00:00Z')).body.lanes[0];
		expect(both).toEqual({ laneIndex: 0, reentryAt: '2026-07-04T15:00:00.000Z', harvestAt: '2026-07-31T19:00:00.000Z', grazingAt: '2026-07-31T19:00:00.000Z' });
	});

	it('uses the farm\'s own time zone for calendar days', async () => {
		const s = await recordFarm(SEASON);
		await db()('farms').where({ id: s.farm.id }).update({ time_zone: 'Pacific/Auckland' });
		// 20:00 on 4 April 2026 in Auckland (NZDT, +13); clocks go back at 03:00 on 5 April.
		const res = await log(s, '2026-04-04T20:00:00+13:00', [s.products.fungicide], [0]);
		expect(res.status).toBe(201);
		const lane = (await at(s, '2026-04-04T08:00:00Z')).body.lanes[0];
		// 7 calendar days: 20:00 NZST (+12) on 11 April = 08:00Z.
		expect(lane.harvestAt).toBe('2026-04-11T08:00:00.000Z');
		expect(lane.reentryAt).toBe('2026-04-05T07:00:00.000Z');
	});

	it('answers 400 to a time that is not ISO 8601 and 404 to a season without a plan', async () => {
		const s = await recordFarm(SEASON);
		const bad = await call(restrictionsRoute.GET, s.members.owner, s.params, { query: 'at=tomorrow' });
		expect(bad.status).toBe(400);
		expect(bad.body.error.fields).toEqual({ at: ['Use ISO 8601 with an offset.'] });
		const none = await call(restrictionsRoute.GET, s.members.owner, { ...s.params, season: '2019' });
		expect(none.status).toBe(404);
		expect(none.body.error.message).toBe('No adopted plan for 2019 here: it does not exist, was deleted, or is not shared with you.');
		const now = await call(restrictionsRoute.GET, s.members.owner, s.params);
		expect(now.status).toBe(200);
		expect(now.body.lanes.every((l: { reentryAt: null }) => l.reentryAt === null)).toBe(true);
	});
});

// The farm settings page's units and time-zone forms: only the owner may change them, an unknown
// zone is answered beside its select, the saved value is what the farm reads back, and changing
// the zone leaves every stored record as it was.
import { describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { requireMember } from '$lib/server/access';
import { actions, load } from '../../src/routes/(app)/farms/[farmId]/settings/+page.server';
import { fakeEvent, makeFarmWithTeam, makeUser } from './helpers';
import { call, hoursAgo, recordFarm, routes } from './records-setup';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function formEvent(user: SessionUser, farmId: string, action: string, form: Record<string, string>): any {
	const url = new URL(`http://127.0.0.1/farms/${farmId}/settings?/${action}`);
	const body = new FormData();
	for (const [k, v] of Object.entries(form)) body.set(k, v);
	return { locals: { user, session: null }, url, params: { farmId }, request: new Request(url, { method: 'POST', body }) };
}

/** What an action answered or threw (an error), for assertions on its status. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const settle = (p: unknown): Promise<any> => Promise.resolve(p).catch((e) => e);

const readFarm = async (farmId: string) => db()('farms').where({ id: farmId }).first('units', 'time_zone');

describe('farm units', () => {
	it('refuses manager, crew, advisor and viewer with 403 and an outsider with 404, changing nothing', async () => {
		const { farm, members } = await makeFarmWithTeam();
		for (const role of ['manager', 'crew', 'advisor', 'viewer'] as const) {
			const refused = await settle(actions.units(formEvent(members[role], farm.id, 'units', { units: 'metric' })));
			expect(refused.status, role).toBe(403);
			expect(refused.body.code, role).toBe('forbidden');
		}
		const outsider = await makeUser('outsider');
		const hidden = await settle(actions.units(formEvent(outsider, farm.id, 'units', { units: 'metric' })));
		expect(hidden.status).toBe(404);
		expect(hidden.body.code).toBe('not_found');
		expect(await readFarm(farm.id)).toEqual({ units: 'us', time_zone: 'America/Chicago' });
	});

	it('saves metric for the owner; the farm reads it back and the audit log keeps before and after', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const saved = await actions.units(formEvent(members.owner, farm.id, 'units', { units: 'metric' }));
		expect(saved).toMatchObject({ form: { valid: true, data: { units: 'metric' }, message: 'Areas now show in hectares and lengths in metres.' } });
		expect((await readFarm(farm.id)).units).toBe('metric');
		expect((await requireMember(fakeEvent(members.viewer), farm.id)).farm.units).toBe('metric');
		const audit = await db()('audit_log').where({ farm_id: farm.id, action: 'units' });
		expect(audit.map((a) => [a.before, a.after])).toEqual([[{ units: 'us' }, { units: 'metric' }]]);
	});

	it('answers an unknown system with 400 beside the choice', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const bad = await settle(actions.units(formEvent(members.owner, farm.id, 'units', { units: 'imperial' })));
		expect(bad.status).toBe(400);
		expect(bad.data.unitsForm.errors.units).toEqual(['Choose US customary or metric.']);
		expect((await readFarm(farm.id)).units).toBe('us');
	});
});

describe('farm time zone', () => {
	it('refuses manager, crew, advisor and viewer with 403 and an outsider with 404', async () => {
		const { farm, members } = await makeFarmWithTeam();
		for (const role of ['manager', 'crew', 'advisor', 'viewer'] as const) {
			const refused = await settle(actions.timeZone(formEvent(members[role], farm.id, 'timeZone', { timeZone: 'Europe/Berlin' })));
			expect(refused.status, role).toBe(403);
		}
		const outsider = await makeUser('outsider');
		expect((await settle(actions.timeZone(formEvent(outsider, farm.id, 'timeZone', { timeZone: 'Europe/Berlin' })))).status).toBe(404);
		expect((await readFarm(farm.id)).time_zone).toBe('America/Chicago');
	});

	it('answers an unknown zone with a field error that names it, and keeps the old zone', async () => {
		const { farm, members } = await makeFarmWithTeam();
		for (const timeZone of ['Mars/Olympus_Mons', 'america/chicago', '']) {
			const bad = await settle(actions.timeZone(formEvent(members.owner, farm.id, 'timeZone', { timeZone })));
			expect(bad.status, timeZone).toBe(400);
			expect(bad.data.zoneForm.errors.timeZone, timeZone).toEqual([
				timeZone === ''
					? 'Choose the time zone the farm works in.'
					: `"${timeZone}" is not a time zone this server knows. Choose one from the list, e.g. America/Chicago.`
			]);
		}
		expect((await readFarm(farm.id)).time_zone).toBe('America/Chicago');
		expect(await db()('audit_log').where({ farm_id: farm.id, action: 'time_zone' })).toEqual([]);
	});

	it('saves a known zone, reads it back on the page, and rewrites no stored record', async () => {
		const s = await recordFarm();
		const startedAt = hoursAgo(5);
		const made = await call(routes.listRoute.POST, s.members.crew, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt, endedAt: hoursAgo(4), laneIndexes: [0, 2], products: [{ productId: s.products.herbicide, rate: 1.5, rateUnit: 'pt/ac' }], applicator: 'Crew member' }
		});
		expect(made.status, JSON.stringify(made.body)).toBe(201);
		const rowsBefore = await db()('operations').where({ field_id: s.field.id });
		const one = { ...s.params, recordId: made.body.id };
		const before = await call(routes.oneRoute.GET, s.members.owner, one);

		const saved = await actions.timeZone(formEvent(s.members.owner, s.farm.id, 'timeZone', { timeZone: 'Pacific/Auckland' }));
		expect(saved).toMatchObject({ form: { valid: true, data: { timeZone: 'Pacific/Auckland' }, message: 'Days and times now read in Pacific/Auckland.' } });
		expect((await readFarm(s.farm.id)).time_zone).toBe('Pacific/Auckland');
		const page = (await load({ ...fakeEvent(s.members.owner, `/farms/${s.farm.id}/settings`), params: { farmId: s.farm.id } } as never)) as { zoneForm: { data: { timeZone: string } }; zones: string[] };
		expect(page.zoneForm.data.timeZone).toBe('Pacific/Auckland');
		expect(page.zones).toContain('Pacific/Auckland');

		// The record keeps its instant and every stored column, bit for bit.
		expect(await db()('operations').where({ field_id: s.field.id })).toEqual(rowsBefore);
		const after = await call(routes.oneRoute.GET, s.members.owner, one);
		expect(new Date(after.body.startedAt).toISOString()).toBe(new Date(startedAt).toISOString());
		expect(after.body.startedAt).toBe(before.body.startedAt);
		expect(after.body.acres).toBe(before.body.acres);
		const audit = await db()('audit_log').where({ farm_id: s.farm.id, action: 'time_zone' });
		expect(audit.map((a) => [a.before, a.after])).toEqual([[{ timeZone: 'America/Chicago' }, { timeZone: 'Pacific/Auckland' }]]);
	});
});

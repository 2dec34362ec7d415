// Every page, form action and /api route, found from the route tree, tried by every kind of
// caller against the product's permission matrix (tests/e2e/permission-matrix.ts). A route the
// matrix does not name fails the test, so a new route cannot ship without a rule.
// Allowed reads must answer; refused calls must answer 401/403/404 (never reveal another farm's
// ids). Allowed writes are not sent: this spec never changes the demo. Refused writes are sent for
// real (form actions with the site's Origin, API writes as JSON) and must change nothing.
import { expect, test, type APIRequestContext } from '@playwright/test';
import knexFactory from 'knex';
import { DEMO_FARM_ID, demoEmail, DEMO_PASSWORD, uniqueEmail, apiSignUp } from './helpers';
import {
	applies,
	CALLERS,
	discoverRoutes,
	expectedOutcome,
	RULES,
	satisfies,
	type Caller,
	type Outcome,
	type RouteMethod
} from './permission-matrix';

const FIELDS = {
	north80: '5a1e0000-0000-4000-8000-0000000001f1',
	// The only field the demo viewer (the landlord) is granted.
	wideRow: '5a1e0000-0000-4000-8000-0000000001f2',
	pasture: '5a1e0000-0000-4000-8000-0000000001f3'
};
const SEASON = 2026;
// The demo tour's fixed share link (seeds/10_demo_reports_tours.ts).
const DEMO_TOUR_TOKEN = 'demo-summer-field-day-2027-strips-and-lanes';
const BOGUS_TOKEN = 'not-a-real-token-0123456789abcdef';
const NO_ROW = '00000000-0000-4000-8000-000000000000';

/** Query strings some routes need to answer at all ([name] is filled like a path parameter). */
const QUERIES: Record<string, string> = {
	'GET /farms/switch': '?to=[farmId]',
	'GET /api/farms/[farmId]/seasons/[season]/lane-records': '?fieldId=[fieldId]&laneIndex=0',
	'GET /api/farms/[farmId]/rainfall/readings': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/fields/[fieldId]/export.geojson': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/fields/[fieldId]/export.shp.zip': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/fields/[fieldId]/taskdata.zip': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/reports/acreage': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/reports/acreage.csv': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/reports/acreage.pdf': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/reports/landlord/[fieldId]': `?season=${SEASON}`,
	'GET /api/farms/[farmId]/reports/landlord/[fieldId]/summary.pdf': `?season=${SEASON}`
};

/**
 * Calls that answer wrongly today in pages this change may not touch; each is written up with its
 * fix for whoever owns the page. The test asserts the wrong answer still comes, so the entry must
 * go once the page is fixed (the test then fails and says so). Key: "<route key> as <caller>".
 */
const AWAITING_FIX: Record<string, { status: number; fix: string }> = {};

type Ids = Record<string, string>;

/**
 * Demo rows for route parameters. `fields` lists where field-bound rows may come from (in order of
 * preference); farm-wide rows (equipment, catalogue, livestock groups, gauges, tours) are shared.
 */
async function demoIds(knex: ReturnType<typeof knexFactory>, fields: string[]): Promise<Ids> {
	const first = async (sql: string, bindings: Record<string, unknown> = {}): Promise<string | undefined> =>
		(await knex.raw(sql, { farm: DEMO_FARM_ID, fields: `{${fields.join(',')}}`, season: SEASON, ...bindings })).rows[0]?.id;
	const byField = (table: string, extra = '') =>
		first(`select id from ${table} where farm_id = :farm and field_id = any(cast(:fields as uuid[])) and deleted_at is null ${extra}
			order by array_position(cast(:fields as uuid[]), field_id), id limit 1`);
	const ids: Record<string, string | undefined> = {
		farmId: DEMO_FARM_ID,
		fieldId: fields[0],
		season: String(SEASON),
		recordId: await byField('operations', 'and season = :season'),
		noteId: await byField('scouting_notes', 'and season = :season'),
		entryId: await byField('harvest_entries', 'and season = :season'),
		importId: await byField('yield_imports', 'and season = :season'),
		moveId: await byField('grazing_moves'),
		photoId: await byField('attachments', "and entity = 'scouting_note'"),
		equipmentId: await first(`select id from equipment where farm_id = :farm and deleted_at is null order by id limit 1`),
		productId: await first(`select id from products where farm_id = :farm and deleted_at is null order by id limit 1`),
		lotId: await first(`select l.id from seed_lots l join varieties v on v.id = l.variety_id
			where l.farm_id = :farm and l.deleted_at is null and v.deleted_at is null order by l.id limit 1`),
		groupId: await first(`select id from livestock_groups where farm_id = :farm and deleted_at is null order by id limit 1`),
		gaugeId: await first(`select id from rain_gauges where farm_id = :farm and deleted_at is null order by id limit 1`),
		readingId: await first(`select id from rainfall_readings where farm_id = :farm and deleted_at is null order by id limit 1`),
		tourId: await first(`select id from tours where farm_id = :farm and revoked_at is null order by id limit 1`),
		stop: '1',
		token: BOGUS_TOKEN,
		photo: NO_ROW
	};
	// The lot must belong to the variety in the same path.
	ids.varietyId = ids.lotId ? await first(`select variety_id as id from seed_lots where id = :lot`, { lot: ids.lotId }) : undefined;
	return Object.fromEntries(Object.entries(ids).filter(([, v]) => v)) as Ids;
}

function fill(route: RouteMethod, ids: Ids): { path: string; missing: string[] } {
	const missing: string[] = [];
	const put = (template: string) =>
		template.replace(/\[(\w+)\]/g, (_, name: string) => {
			if (ids[name]) return ids[name];
			missing.push(name);
			return NO_ROW;
		});
	const [pathname, action] = route.path.split('?');
	const path = put(pathname) + (action ? `?${action}` : '') + (QUERIES[route.key] ? put(QUERIES[route.key]) : '');
	return { path, missing };
}

function classify(status: number, location: string): Outcome {
	if (status >= 300 && status < 400) return location.startsWith('/sign-in') ? 'sign-in' : 'redirect';
	if (status >= 200 && status < 300) return 'ok';
	if (status === 401) return 'sign-in';
	if (status === 403) return 'forbidden';
	if (status === 404) return 'not-found';
	if ([400, 409, 413, 422].includes(status)) return 'invalid';
	if (status >= 500) return 'error';
	return 'other';
}

async function call(request: APIRequestContext, method: string, path: string, origin: string, refused: boolean): Promise<{ status: number; outcome: Outcome; text: string; location: string }> {
	const isApi = path.startsWith('/api/');
	const headers: Record<string, string> = { origin };
	// A refused read must stay refused even for a client that claims to hold the current version.
	if (refused && method === 'GET') headers['if-none-match'] = '*';
	let data: unknown;
	let form: Record<string, string> | undefined;
	if (method !== 'GET' && method !== 'DELETE') {
		if (isApi) data = {};
		else form = {};
	}
	// A form action answers a plain (not script-enhanced) post: real status codes, not a JSON envelope.
	if (!isApi && method === 'POST') headers.accept = 'text/html';
	const res = await request.fetch(path, { method, headers, data, form, maxRedirects: 0, failOnStatusCode: false });
	const type = res.headers()['content-type'] ?? '';
	const text = /json|html|csv|text|xml/.test(type) ? await res.text() : '';
	const location = res.headers()['location'] ?? '';
	return { status: res.status(), outcome: classify(res.status(), location), text, location };
}

interface Tally {
	checked: number;
	allowedWritesSkipped: number;
	noDemoRow: number;
}

test('every route in the route tree has a rule in the permission matrix, and every rule a route', () => {
	const routes = discoverRoutes();
	expect(routes.length).toBeGreaterThan(150);
	const unruled = routes.filter((r) => !(r.key in RULES)).map((r) => r.key);
	expect(unruled, 'routes with no rule in tests/e2e/permission-matrix.ts').toEqual([]);
	const stale = Object.keys(RULES).filter((k) => !routes.some((r) => r.key === k));
	expect(stale, 'rules for routes that no longer exist').toEqual([]);
});

test('every route answers each caller as the permission matrix says', async ({ playwright, baseURL }) => {
	test.setTimeout(300_000);
	const origin = new URL(baseURL!).origin;
	const routes = discoverRoutes().filter((r) => r.key in RULES);

	const knex = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL });
	let granted: Ids, ungranted: Ids, tourTitle: string, equipmentNames: string[], otherEmails: string[], farmNames: string[];
	try {
		// Roles that see every field read North 80 (the richest demo field); the viewer reads the field
		// it is granted; the same viewer without a grant is sent North 80's and the pasture's rows.
		granted = await demoIds(knex, [FIELDS.wideRow]);
		ungranted = await demoIds(knex, [FIELDS.north80, FIELDS.pasture]);
		tourTitle = (await knex('tours').where({ farm_id: DEMO_FARM_ID }).whereNull('revoked_at').first('title')).title;
		// The demo farm shows viewers neither its equipment nor its members' e-mail addresses.
		const privacy = await knex('farms').where({ id: DEMO_FARM_ID }).first('viewers_see_equipment', 'viewers_see_member_emails');
		expect(privacy).toEqual({ viewers_see_equipment: false, viewers_see_member_emails: false });
		farmNames = [
			(await knex('farms').where({ id: DEMO_FARM_ID }).first('name')).name,
			// The seeded fields only: other tests may add fields of their own to the demo farm.
			...((await knex('fields').whereIn('id', Object.values(FIELDS)).pluck('name')) as string[])
		];
		equipmentNames = (await knex('equipment').where({ farm_id: DEMO_FARM_ID }).whereNull('deleted_at').pluck('name')) as string[];
		otherEmails = (await knex('memberships as m').join('users as u', 'u.id', 'm.user_id')
			.where({ 'm.farm_id': DEMO_FARM_ID }).whereNot('m.role', 'viewer').pluck('u.email')) as string[];
	} finally {
		await knex.destroy();
	}
	expect(ungranted.recordId && ungranted.noteId && ungranted.photoId && ungranted.moveId, 'demo rows on North 80 and the pasture').toBeTruthy();
	expect(granted.recordId && granted.noteId && granted.entryId, 'demo rows on the field granted to the viewer').toBeTruthy();

	const contexts: APIRequestContext[] = [];
	const newContext = async () => {
		const ctx = await playwright.request.newContext({ baseURL });
		contexts.push(ctx);
		return ctx;
	};
	const signedIn = async (role: string) => {
		const ctx = await newContext();
		const res = await ctx.post('/api/session', { data: { email: demoEmail(role), password: DEMO_PASSWORD } });
		expect(res.status(), `sign-in of the demo ${role}`).toBe(200);
		return ctx;
	};
	const owner = await signedIn('owner');
	const viewer = await signedIn('viewer');
	// Someone signed in who owns a farm of their own but is no member of the demo farm.
	const outsider = await newContext();
	await apiSignUp(outsider, baseURL!, 'Outsider', uniqueEmail('outsider'), 'a good long password');
	const made = await outsider.post('/farms?/create', { form: { name: 'Outsider test farm' }, headers: { origin, accept: 'text/html' }, maxRedirects: 0 });
	expect(made.status()).toBe(303);
	const outsiderFarmId = /^\/farms\/([0-9a-f-]{36})$/.exec(made.headers()['location'] ?? '')?.[1];
	expect(outsiderFarmId, 'the outsider\'s own farm').toBeTruthy();
	// A visitor without a session who opened the tour link they were given.
	const visitor = await newContext();
	const tour = await visitor.get(`/share/${DEMO_TOUR_TOKEN}`);
	expect(tour.status()).toBe(200);
	expect(await tour.text()).toContain(tourTitle);

	const setups: Record<Caller, { ctx: APIRequestContext; ids: Ids }> = {
		owner: { ctx: owner, ids: ungranted },
		manager: { ctx: await signedIn('manager'), ids: ungranted },
		crew: { ctx: await signedIn('crew'), ids: ungranted },
		advisor: { ctx: await signedIn('advisor'), ids: ungranted },
		viewer: { ctx: viewer, ids: granted },
		viewerNoGrant: { ctx: viewer, ids: ungranted },
		viewerCrossField: { ctx: viewer, ids: { ...ungranted, fieldId: FIELDS.wideRow } },
		ownerCrossField: { ctx: owner, ids: { ...ungranted, fieldId: FIELDS.wideRow } },
		outsider: { ctx: outsider, ids: ungranted },
		outsiderCrossFarm: { ctx: outsider, ids: { ...ungranted, farmId: outsiderFarmId! } },
		visitor: { ctx: visitor, ids: { ...ungranted, token: DEMO_TOUR_TOKEN } },
		anonymous: { ctx: await newContext(), ids: ungranted }
	};

	// What the viewer must never be shown: the fields not granted to it and their rows (by id or
	// name), the equipment and the other members' e-mail addresses. Its own field must show.
	const hidden = [FIELDS.north80, FIELDS.pasture, 'North 80', 'Shelter Lanes', ungranted.recordId, ungranted.noteId, ungranted.photoId, ungranted.moveId, ...equipmentNames, ...otherEmails];
	expect(equipmentNames.length).toBeGreaterThan(3);
	expect(otherEmails).toContain(demoEmail('crew'));
	const leaks: string[] = [];
	let grantedFieldShown = 0;
	// Nobody outside the farm learns its name or its fields' names from any answer, refusals included
	// (the visitor's tour pages excepted: they show the fields on the tour).
	const strangers: Caller[] = ['outsider', 'outsiderCrossFarm', 'visitor', 'anonymous'];
	expect(farmNames.length).toBe(4);
	let tourNamesFields = 0;
	const wrong: string[] = [];
	const stillAwaiting: string[] = [];
	const tally = {} as Record<Caller, Tally>;
	// One caller's calls go one after another; the callers run side by side.
	await Promise.all(
		CALLERS.map(async (caller) => {
			const t: Tally = (tally[caller] = { checked: 0, allowedWritesSkipped: 0, noDemoRow: 0 });
			const { ctx, ids } = setups[caller];
			for (const route of routes) {
				const rule = RULES[route.key];
				if (!applies(rule, caller, route.path + (QUERIES[route.key] ?? ''))) continue;
				const expected = expectedOutcome(rule, caller, route.method);
				if (expected === 'skip') {
					t.allowedWritesSkipped++;
					continue;
				}
				const { path, missing } = fill(route, ids);
				// Without a demo row for an id an allowed read cannot answer; refusals are still checked.
				if (expected === 'ok' && missing.length) {
					t.noDemoRow++;
					continue;
				}
				const got = await call(ctx, route.method, path, origin, expected !== 'ok');
				t.checked++;
				const name = `${route.key} as ${caller}`;
				const awaiting = AWAITING_FIX[name];
				if (awaiting) {
					if (got.status !== awaiting.status) stillAwaiting.push(`${name}: now answers ${got.status}; remove it from AWAITING_FIX`);
				} else if (!satisfies(expected, got.outcome, caller, route, got.location)) {
					wrong.push(`${name} (${route.method} ${path}): expected ${expected}, got ${got.status}${got.location ? ` to ${got.location}` : ''}`);
				}
				if (strangers.includes(caller) && got.text) {
					const shown = farmNames.filter((h) => got.text.includes(h));
					if (caller === 'visitor' && rule === 'shareLink') tourNamesFields += shown.length ? 1 : 0;
					else if (shown.length) leaks.push(`${route.key} shows the ${caller} ${shown.join(', ')}`);
				}
				if (caller === 'viewer' && got.status < 300 && got.text) {
					const shown = hidden.filter((h) => got.text.includes(h));
					if (shown.length) leaks.push(`${route.key} shows the viewer ${shown.join(', ')}`);
					if (got.text.includes('Creek Bend')) grantedFieldShown++;
				}
			}
		})
	);

	console.log(`permission matrix: ${routes.length} route methods`);
	for (const caller of CALLERS) {
		const t = tally[caller];
		console.log(`  ${caller.padEnd(18)} ${String(t.checked).padStart(4)} checked, ${t.allowedWritesSkipped} allowed writes not sent, ${t.noDemoRow} allowed reads without a demo row`);
	}
	console.log(`  total ${CALLERS.reduce((n, c) => n + tally[c].checked, 0)} calls checked`);
	expect(wrong, 'calls answered against the permission matrix').toEqual([]);
	expect(leaks, 'what the caller may not see, shown to it').toEqual([]);
	expect(grantedFieldShown, 'answers to the viewer naming its own field, Creek Bend').toBeGreaterThan(20);
	expect(tourNamesFields, 'tour pages naming the fields on the tour, to the visitor').toBe(2);
	expect(stillAwaiting).toEqual([]);
	for (const caller of CALLERS) expect(tally[caller].checked, `calls checked as ${caller}`).toBeGreaterThan(caller.endsWith('CrossField') ? 10 : 50);
	for (const ctx of contexts) await ctx.dispose();
});

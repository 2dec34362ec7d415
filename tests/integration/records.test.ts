import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { savePlan, getPlan } from '$lib/server/plans';
import { call, hoursAgo, operationCount, recordFarm, routes, THIS_SEASON } from './records-setup';

const { listRoute, oneRoute, csvRoute } = routes;

describe('season records', () => {
	it('logs a spraying pass: 201, acres are the lanes\' acres, total = rate × acres, label intervals copied', async () => {
		const s = await recordFarm();
		const lanes = [0, 2, 4];
		const res = await call(listRoute.POST, s.members.crew, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(5), endedAt: hoursAgo(3), laneIndexes: lanes, products: [{ productId: s.products.herbicide, rate: 1.5, rateUnit: 'pt/ac' }], applicator: 'Crew member', weather: { tempF: 72, windMph: 6, windFrom: 'SW' } }
		});
		expect(res.status, JSON.stringify(res.body)).toBe(201);
		const expectedAcres = lanes.reduce((sum, i) => sum + s.plan.lanes[i].acres, 0);
		expect(res.body.acres).toBeCloseTo(expectedAcres, 4);
		// 20 ft × 1,320 ft = 26,400 sq ft = 0.6061 ac a lane (43,560 sq ft per acre), three lanes ≈ 1.818 ac.
		expect(res.body.acres).toBeCloseTo(1.8182, 3);
		expect(res.body.products).toHaveLength(1);
		const line = res.body.products[0];
		expect(line).toMatchObject({ productId: s.products.herbicide, rate: 1.5, rateUnit: 'pt/ac', totalUnit: 'pt', reiHours: 12, phiDays: 30, grazingDays: 14 });
		expect(line.total).toBeCloseTo(1.5 * res.body.acres, 4);
		// 8 pt = 1 gal (US liquid measure).
		expect(line.shownTotal.unit).toBe('gal');
		expect(line.shownTotal.amount).toBeCloseTo((1.5 * res.body.acres) / 8, 4);
		expect(res.body.laneIndexes).toEqual(lanes);
		expect(res.body.lanes.map((l: { crop: string }) => l.crop)).toEqual(['corn', 'corn', 'corn']);
		expect(res.body.weather).toEqual({ tempF: 72, windMph: 6, windFrom: 'SW' });
		expect(res.body.warnings).toEqual([]);
		expect(res.body.location).toBe('Record test (farm 1234, tract 56, field 3), lanes 1, 3, 5');

		const list = await call(listRoute.GET, s.members.viewer, s.params);
		expect(list.status).toBe(404); // the viewer has no field granted
		const listed = await call(listRoute.GET, s.members.advisor, s.params);
		expect(listed.body.records.map((r: { id: string }) => r.id)).toEqual([res.body.id]);
	});

	it('covers part of a lane by distance along it', async () => {
		const s = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'mowing', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [1, 3], laneParts: [{ laneIndex: 1, fromFt: 0, toFt: 660 }] }
		});
		expect(res.status, JSON.stringify(res.body)).toBe(201);
		// Half of lane 2 (660 of 1,320 ft) and all of lane 4.
		expect(res.body.acres).toBeCloseTo(s.plan.lanes[1].acres / 2 + s.plan.lanes[3].acres, 3);
		expect(res.body.lanes[0]).toMatchObject({ laneIndex: 1, fromFt: 0, toFt: 660 });
		const tooFar = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'mowing', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [1], laneParts: [{ laneIndex: 1, fromFt: 0, toFt: 2000 }] }
		});
		expect(tooFar.status).toBe(400);
		expect(tooFar.body.error.fields.laneParts[0]).toBe('Lane 2 is about 1,320 ft long; 2000 ft runs past its end.');
	});

	it('refuses lanes the season plan does not have, naming them, and writes nothing', async () => {
		const s = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'tillage', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [0, 33, 40] }
		});
		expect(res.status).toBe(400);
		expect(res.body.error.fields.laneIndexes).toEqual([`Lane indexes 33 (lane 34), 40 (lane 41) are not in the ${THIS_SEASON} plan, which has lanes 1 to 33 (indexes 0 to 32).`]);
		expect(await operationCount(s.field.id)).toBe(0);
	});

	it('refuses a season with no adopted plan with a clear 400', async () => {
		const s = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, { ...s.params, season: String(THIS_SEASON - 1) }, {
			method: 'POST',
			json: { type: 'tillage', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [0] }
		});
		expect(res.status).toBe(400);
		expect(res.body.error.code).toBe('no_plan');
		expect(res.body.error.message).toBe(`There is no adopted plan for ${THIS_SEASON - 1} on this field, so there are no lanes to record on. Lay out and adopt the ${THIS_SEASON - 1} plan first.`);
	});

	it('refuses an end before the start, work dated in the future, and zero or negative rates', async () => {
		const s = await recordFarm();
		const post = (json: object) => call(listRoute.POST, s.members.owner, s.params, { method: 'POST', json: { type: 'spraying', laneIndexes: [0], ...json } });
		const backwards = await post({ startedAt: hoursAgo(1), endedAt: hoursAgo(2) });
		expect(backwards.status).toBe(400);
		expect(backwards.body.error.fields.endedAt).toEqual(['The work cannot end before it started.']);
		const future = await post({ startedAt: hoursAgo(1), endedAt: new Date(Date.now() + 3 * 3_600_000).toISOString() });
		expect(future.status).toBe(400);
		expect(future.body.error.fields.endedAt).toEqual(['This is a record of work done: its end cannot be in the future.']);
		for (const rate of [0, -2]) {
			const bad = await post({ startedAt: hoursAgo(2), endedAt: hoursAgo(1), products: [{ productId: s.products.herbicide, rate, rateUnit: 'pt/ac' }] });
			expect(bad.status).toBe(400);
			expect(bad.body.error.fields['products.0.rate']).toEqual(['A rate must be more than 0.']);
		}
		const unit = await post({ startedAt: hoursAgo(2), endedAt: hoursAgo(1), products: [{ productId: s.products.herbicide, rate: 1, rateUnit: 'pints' }] });
		expect(unit.status).toBe(400);
		expect(Object.keys(unit.body.error.fields)).toEqual(['products.0.rateUnit']);
		const notIso = await post({ startedAt: 'yesterday', endedAt: hoursAgo(1) });
		expect(notIso.status).toBe(400);
		expect(Object.keys(notIso.body.error.fields)).toEqual(['startedAt']);
		expect(await operationCount(s.field.id)).toBe(0);
	});

	it('keeps an implausible rate with a warning', async () => {
		const s = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [0], products: [{ productId: s.products.herbicide, rate: 15, rateUnit: 'qt/ac' }] }
		});
		expect(res.status).toBe(201);
		expect(res.body.warnings).toEqual([{ field: 'products.0.rate', message: '15 qt/ac is more than the usual most of 8 qt/ac. Saved as entered; check the label and the number.' }]);
	});

	it('refuses another farm\'s product on the line that names it, without telling what it is', async () => {
		const s = await recordFarm();
		const other = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [0], products: [{ productId: s.products.fungicide, rate: 4, rateUnit: 'fl oz/ac' }, { productId: other.products.herbicide, rate: 1, rateUnit: 'pt/ac' }] }
		});
		expect(res.status).toBe(400);
		expect(res.body.error.fields).toEqual({ 'products.1.productId': ["No such product in this farm's product list. Pick one from the list (or add it there first)."] });
		expect(JSON.stringify(res.body)).not.toContain('residual herbicide');
		expect(await operationCount(s.field.id)).toBe(0);
	});

	it('refuses a restricted-use record without the applicator, the certification number or the EPA number', async () => {
		const s = await recordFarm();
		const base = { type: 'spraying', startedAt: hoursAgo(3), endedAt: hoursAgo(2), laneIndexes: [0, 1] };
		const none = await call(listRoute.POST, s.members.owner, s.params, { method: 'POST', json: { ...base, products: [{ productId: s.products.rup, rate: 3.2, rateUnit: 'fl oz/ac' }] } });
		expect(none.status).toBe(400);
		expect(none.body.error.code).toBe('rup_incomplete');
		expect(Object.keys(none.body.error.fields).sort()).toEqual(['applicator', 'applicatorCertNumber']);
		const noEpa = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { ...base, applicator: 'A. Applicator', applicatorCertNumber: 'PA-0001', products: [{ productId: s.products.rupNoEpa, rate: 3, rateUnit: 'fl oz/ac' }] }
		});
		expect(noEpa.status).toBe(400);
		expect(noEpa.body.error.fields['products.0.productId']).toEqual(['"insecticide without number" has no EPA registration number in the product list; add it there first: a restricted-use pesticide record needs it (7 CFR 110.3).']);
		expect(await operationCount(s.field.id)).toBe(0);

		const full = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { ...base, applicator: 'A. Applicator', applicatorCertNumber: 'PA-0001', products: [{ productId: s.products.rup, rate: 3.2, rateUnit: 'fl oz/ac' }] }
		});
		expect(full.status).toBe(201);
		// Every element of 7 CFR 110.3 is on the record.
		expect(full.body).toMatchObject({ restrictedUse: true, rupLate: false, applicator: 'A. Applicator', applicatorCertNumber: 'PA-0001', location: 'Record test (farm 1234, tract 56, field 3), lanes 1–2' });
		expect(full.body.products[0]).toMatchObject({ productName: 'insecticide C', epaRegNo: '00000-333' });
		expect(full.body.products[0].total).toBeGreaterThan(0);
		expect(full.body.lanes.map((l: { crop: string }) => l.crop)).toEqual(['corn', 'soybean']);

		// Removing the applicator later is refused the same way, and the record stays as it was.
		const edit = await call(oneRoute.PATCH, s.members.owner, { ...s.params, recordId: full.body.id }, { method: 'PATCH', json: { version: 1, applicatorCertNumber: null } });
		expect(edit.status).toBe(400);
		expect(Object.keys(edit.body.error.fields)).toEqual(['applicatorCertNumber']);
		const stored = await call(oneRoute.GET, s.members.owner, { ...s.params, recordId: full.body.id });
		expect(stored.body.applicatorCertNumber).toBe('PA-0001');
		expect(stored.body.version).toBe(1);
	});

	it('flags a restricted-use record completed more than 14 days after the application', async () => {
		const s = await recordFarm();
		const post = (endedHoursAgo: number) =>
			call(listRoute.POST, s.members.owner, s.params, {
				method: 'POST',
				json: { type: 'spraying', startedAt: hoursAgo(endedHoursAgo + 1), endedAt: hoursAgo(endedHoursAgo), laneIndexes: [0], applicator: 'A. Applicator', applicatorCertNumber: 'PA-0001', products: [{ productId: s.products.rup, rate: 3, rateUnit: 'fl oz/ac' }] }
			});
		const inTime = await post(13 * 24);
		const late = await post(15 * 24);
		expect([inTime.status, late.status]).toEqual([201, 201]);
		expect(inTime.body.rupLate).toBe(false);
		expect(late.body.rupLate).toBe(true);
		// A later edit of the late record keeps the moment it was completed.
		const edited = await call(oneRoute.PATCH, s.members.owner, { ...s.params, recordId: late.body.id }, { method: 'PATCH', json: { version: 1, notes: 'wind checked' } });
		expect(edited.status).toBe(200);
		expect(edited.body.rupCompletedAt).toBe(late.body.rupCompletedAt);
		expect(edited.body.rupLate).toBe(true);
	});

	it('keeps the lanes and label data as logged when the plan and the product change later', async () => {
		const s = await recordFarm();
		const res = await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: hoursAgo(2), endedAt: hoursAgo(1), laneIndexes: [0], products: [{ productId: s.products.herbicide, rate: 1, rateUnit: 'pt/ac' }] }
		});
		expect(res.status).toBe(201);
		const plan = await getPlan(s.access, s.field.id, THIS_SEASON);
		// Shift the pattern by one lane: lane 1 is soybean now.
		await savePlan(s.access, s.field.id, THIS_SEASON, { guidance: plan.guidance, pattern: plan.pattern, offsetFt: 20, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: plan.version });
		await db()('products').where({ id: s.products.herbicide }).update({ rei_hours: 48, name: 'renamed herbicide' });
		const read = await call(oneRoute.GET, s.members.owner, { ...s.params, recordId: res.body.id });
		expect(read.body.lanes[0]).toMatchObject({ laneIndex: 0, crop: 'corn' });
		expect(read.body.lanes[0].geometry.type).toBe('Polygon');
		expect(read.body.products[0]).toMatchObject({ reiHours: 12, productName: res.body.products[0].productName });
		expect(read.body.planVersion).toBe(1);
	});

	it('edits with the version it read; a stale version gets 409 and changes nothing', async () => {
		const s = await recordFarm();
		const created = await call(listRoute.POST, s.members.crew, s.params, {
			method: 'POST',
			json: { type: 'fertilizer', startedAt: hoursAgo(4), endedAt: hoursAgo(3), laneIndexes: [0, 2], products: [{ productId: s.products.uan, rate: 15, rateUnit: 'gal/ac' }], details: { placement: 'side-dress', analysis: '32-0-0' } }
		});
		expect(created.status).toBe(201);
		const id = created.body.id;
		const edit = await call(oneRoute.PATCH, s.members.crew, { ...s.params, recordId: id }, { method: 'PATCH', json: { version: 1, laneIndexes: [0, 2, 4] } });
		expect(edit.status, JSON.stringify(edit.body)).toBe(200);
		expect(edit.body.version).toBe(2);
		expect(edit.body.acres).toBeCloseTo(s.plan.lanes[0].acres + s.plan.lanes[2].acres + s.plan.lanes[4].acres, 4);
		expect(edit.body.products[0].total).toBeCloseTo(15 * edit.body.acres, 3);
		expect(edit.body.details).toEqual({ placement: 'side-dress', analysis: '32-0-0' });
		const stale = await call(oneRoute.PATCH, s.members.crew, { ...s.params, recordId: id }, { method: 'PATCH', json: { version: 1, notes: 'late' } });
		expect(stale.status).toBe(409);
		expect(stale.body.error.code).toBe('version_conflict');
		const read = await call(oneRoute.GET, s.members.crew, { ...s.params, recordId: id });
		expect(read.body.notes).toBeNull();
		expect(read.body.version).toBe(2);
	});

	it('filters the season by type, lane and product', async () => {
		const s = await recordFarm();
		const post = (json: object) => call(listRoute.POST, s.members.owner, s.params, { method: 'POST', json: { startedAt: hoursAgo(3), endedAt: hoursAgo(2), ...json } });
		const a = await post({ type: 'spraying', laneIndexes: [0, 1], products: [{ productId: s.products.herbicide, rate: 1, rateUnit: 'pt/ac' }] });
		const b = await post({ type: 'fertilizer', laneIndexes: [2], products: [{ productId: s.products.uan, rate: 15, rateUnit: 'gal/ac' }] });
		const c = await post({ type: 'tillage', laneIndexes: [1, 2] });
		const ids = async (query: string) => (await call(listRoute.GET, s.members.owner, s.params, { query })).body.records.map((r: { id: string }) => r.id);
		expect(await ids('type=spraying')).toEqual([a.body.id]);
		expect(await ids('lane=2')).toEqual([b.body.id, c.body.id]);
		expect(await ids(`productId=${s.products.uan}`)).toEqual([b.body.id]);
		expect((await call(listRoute.GET, s.members.owner, s.params, { query: 'lane=x' })).status).toBe(400);
	});

	it('exports the season as CSV, one row per product line, times in the farm\'s zone', async () => {
		const s = await recordFarm();
		const endedAt = `${THIS_SEASON}-01-02T15:30:00Z`; // 09:30 in America/Chicago (UTC−6 in January)
		await call(listRoute.POST, s.members.owner, s.params, {
			method: 'POST',
			json: { type: 'spraying', startedAt: `${THIS_SEASON}-01-02T15:00:00Z`, endedAt, laneIndexes: [0], notes: '=HYPERLINK("x")', products: [{ productId: s.products.herbicide, rate: 1.5, rateUnit: 'pt/ac' }, { productId: s.products.fungicide, rate: 6, rateUnit: 'fl oz/ac' }] }
		});
		const res = await call(csvRoute.GET, s.members.advisor, s.params);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const lines = (res.body as string).trim().split('\r\n');
		expect(lines).toHaveLength(3);
		expect(lines[0].split(',').slice(0, 8)).toEqual(['record id', 'type', 'started (local)', 'ended (local)', 'time zone', 'lanes', 'crops', 'acres (ac)']);
		const row = lines[1].split(',');
		expect(row.slice(1, 7)).toEqual(['Spraying', `${THIS_SEASON}-01-02 09:00`, `${THIS_SEASON}-01-02 09:30`, 'America/Chicago', 'lane 1', 'corn']);
		expect(row.slice(8, 15)).toEqual([row[8], '00000-111', 'no', '1.5', 'pt/ac', row[13], 'pt']);
		expect(lines[2].split(',')[8]).toBe('fungicide D');
		// A cell that would run as a spreadsheet formula is kept as text.
		expect(lines[1]).toContain(`"'=HYPERLINK(""x"")"`);
	});
});

describe('demo record book', () => {
	it('holds two past seasons and the fall work for the coming one, with a restricted-use record and intervals', async () => {
		const farmId = '5a1e0000-0000-4000-8000-00000000f001';
		const rows = await db()('operations').where({ farm_id: farmId }).whereNull('deleted_at').select('season', 'type', 'field_id', 'rup_completed_at', 'ended_at', 'acres');
		const seasons = [...new Set(rows.map((r) => r.season))].sort();
		expect(seasons).toEqual([2025, 2026, 2027]);
		for (const season of [2025, 2026]) {
			const types = new Set(rows.filter((r) => r.season === season).map((r) => r.type));
			for (const t of ['planting', 'fertilizer', 'spraying', 'cover-seeding', 'tillage', 'mowing']) expect(types.has(t), `${season} ${t}`).toBe(true);
			expect(new Set(rows.filter((r) => r.season === season).map((r) => r.field_id)).size).toBe(3);
		}
		const rup = rows.filter((r) => r.rup_completed_at);
		expect(rup.length).toBeGreaterThanOrEqual(4);
		// One restricted-use record was written down late on purpose (20 days after the work).
		const late = rup.filter((r) => new Date(r.rup_completed_at).getTime() - new Date(r.ended_at).getTime() > 14 * 86_400_000);
		expect(late).toHaveLength(1);
		const intervals = await db()('operation_products').where({ farm_id: farmId }).whereNotNull('rei_hours').count('* as n').first();
		expect(Number(intervals?.n)).toBeGreaterThan(5);
		expect(rows.every((r) => r.acres > 0)).toBe(true);
	});
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import { closeJobs, startYieldWorker, type RunningWorker } from '$lib/server/jobs';
import { getYieldImport, processYieldImport, YIELD_UPLOAD_LIMIT } from '$lib/server/yield-import';
import { harvestAnalysis } from '$lib/server/harvest-analysis';
import { GET as listApi, POST as uploadApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports/+server';
import { GET as statusApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports/[importId]/+server';
import { PUT as mappingApi } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports/[importId]/mapping/+server';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';
import { generateYieldFile, YIELD_HEADERS } from '../fixtures/yield-file';
import type { SessionUser } from '$lib/server/auth';

// A real queue and a real worker, in this process.
let worker: RunningWorker;
beforeAll(async () => {
	worker = await startYieldWorker(processYieldImport, { pollingIntervalSeconds: 0.5 });
});
afterAll(async () => {
	await worker.stop();
	await closeJobs();
});

const LNG = -94.18;
const LAT = 43.97;
const MAPPING = { longitude: 'Longitude', latitude: 'Latitude', yield: 'Yld Vol(Dry)(bu/ac)', moisture: 'Moisture(%)', swathWidth: 'Swath Width(ft)', speed: 'Speed(mph)', time: 'Time' };
const yieldOf = (lane: number) => (lane % 2 === 0 ? 200 + lane : 60 + lane / 10);

async function importFarm() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(159, 1000, LNG, LAT);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const field = await createField(access, { name: 'Monitor strips', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const plan = await savePlan(access, field.id, 2026, {
		guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false
	});
	const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
	const path = `/api/farms/${farm.id}/fields/${field.id}/seasons/2026/yield-imports`;
	return { farm, members, access, field, plan, params, path };
}

function uploadEvent(user: SessionUser, path: string, params: Record<string, string>, form: { csv: string; source: string; mapping?: object; name?: string }) {
	const body = new FormData();
	body.set('file', new File([form.csv], form.name ?? 'yield.csv', { type: 'text/csv' }));
	body.set('source', form.source);
	if (form.mapping) body.set('mapping', JSON.stringify(form.mapping));
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'POST', body }), route: { id: path } } as never;
}

function jsonEvent(user: SessionUser, method: string, path: string, params: Record<string, string>, body?: unknown) {
	const url = new URL(`http://127.0.0.1${path}`);
	const init: RequestInit = { method };
	if (body !== undefined) {
		init.headers = { 'content-type': 'application/json' };
		init.body = JSON.stringify(body);
	}
	return { locals: { user, session: null }, url, params, request: new Request(url, init), route: { id: path } } as never;
}

async function untilFinished(user: SessionUser, path: string, params: Record<string, string>, id: string) {
	const seen: number[] = [];
	for (let i = 0; i < 120; i++) {
		const res = await statusApi(jsonEvent(user, 'GET', `${path}/${id}`, { ...params, importId: id }));
		const body = await res.json();
		seen.push(body.progress);
		if (body.status === 'done' || body.status === 'failed') return { body, seen };
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error('the import did not finish within 30 s');
}

describe('yield-monitor import through the queue', () => {
	it('sets points into the right lanes, drops ramps, the stop and the overlap, and keeps the mapping for the source', async () => {
		const { members, params, path, plan, access, field } = await importFarm();
		expect(plan.lanes).toHaveLength(8);
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 8, laneWidthFt: 20, lengthFt: 1000, yieldOf, mishaps: true });
		const res = await uploadApi(uploadEvent(members.crew, path, params, { csv: file.csv, source: 'Combine 1 display', mapping: MAPPING }));
		expect(res.status).toBe(202);
		const started = await res.json();
		expect(started.status).toBe('queued');
		expect(started.headers).toEqual(YIELD_HEADERS);

		const { body } = await untilFinished(members.advisor, path, params, started.id);
		expect(body.error).toBeNull();
		expect(body.status).toBe('done');
		expect(body.progress).toBe(1);
		expect(body.counts.read).toBe(file.expected.total);
		expect(body.counts.dropped).toEqual({ unreadable: 0, stopped: file.expected.stopped, passStart: file.expected.ramp, overlap: file.expected.overlap, noFlow: 0 });
		expect(file.expected).toMatchObject({ stopped: 4, overlap: 32, outside: 30 });
		expect(body.counts.outsideLanes).toBe(30);
		expect(body.counts.kept).toBe(file.expected.total - file.expected.ramp - 4 - 32 - 30);
		// Each lane's mean is its own true yield: no point landed in a neighbour.
		expect(body.lanes.map((l: { laneIndex: number }) => l.laneIndex)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
		for (const lane of body.lanes) {
			expect(lane.crop).toBe(lane.laneIndex % 2 === 0 ? 'corn' : 'soybean');
			expect(lane.meanBushelsPerAcre).toBeCloseTo(yieldOf(lane.laneIndex), 9);
			// 20-ft swath × 5.87 ft a point over a 19 or 20-ft lane 1,000 ft long; the ends (30 ft each) and the ramp are not cut.
			expect(lane.coverage).toBeGreaterThan(0.87);
			expect(lane.coverage).toBeLessThanOrEqual(1);
		}
		const swathShare = (lane: { points: number; acres: number }) => (lane.points * 20 * 4 * (5280 / 3600)) / 43_560 / lane.acres;
		expect(body.lanes[2].coverage).toBeCloseTo(Math.min(1, swathShare(body.lanes[2])), 6);
		expect(body.lanes[1].points).toBe(body.lanes[3].points);
		expect(await db()('yield_import_files').where({ import_id: started.id }).first()).toBeUndefined();

		// The analysis takes the monitor's lane means where nothing was weighed.
		const analysis = await harvestAnalysis(access, field.id, 2026);
		expect(analysis.monitorImportId).toBe(started.id);
		expect(analysis.lanes[4].source).toBe('monitor');
		expect(analysis.lanes[4].laneYield).toBeCloseTo(204, 9);

		// The next file from the same source needs no mapping.
		const again = await uploadApi(uploadEvent(members.crew, path, params, { csv: file.csv, source: 'combine 1 DISPLAY' }));
		const againBody = await again.json();
		expect(againBody.status).toBe('queued');
		expect(againBody.mapping).toMatchObject(MAPPING);
		expect((await untilFinished(members.owner, path, params, againBody.id)).body.status).toBe('done');
		const listed = await (await listApi(jsonEvent(members.advisor, 'GET', path, params))).json();
		expect(listed.map((i: { id: string }) => i.id)).toEqual([againBody.id, started.id]);

		// Next season the strips move 10 ft east: each new 20-ft lane stands half on last year's corn
		// lane and half on its soybean lane, and the history follows the ground, not the lane number.
		const [sw, , , nw] = (field.boundary as unknown as { coordinates: [number, number][][] }).coordinates[0];
		const next = await savePlan(access, field.id, 2027, {
			guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 10, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false
		});
		expect(next.lanes[1].offsetFt).toBeCloseTo(10, 6);
		const history = (await harvestAnalysis(access, field.id, 2027)).history;
		const lane1 = history.find((h) => h.laneIndex === 1)!;
		expect(lane1.seasons.map((s) => s.season)).toEqual([2026]);
		expect(lane1.seasons[0].crops.map((c) => c.crop).sort()).toEqual(['corn', 'soybean']);
		expect(lane1.seasons[0].bushelsPerAcre).toBeCloseTo((yieldOf(0) + yieldOf(1)) / 2, 0);
	});

	it('a new source waits for its columns; a semicolon file with decimal commas reads the same', async () => {
		const { members, params, path } = await importFarm();
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 8, laneWidthFt: 20, lengthFt: 1000, yieldOf, delimiter: ';', decimalComma: true });
		expect(file.csv.split('\n')[1]).toMatch(/^-94,\d+;43,\d+;/);
		const res = await uploadApi(uploadEvent(members.manager, path, params, { csv: file.csv, source: 'Old display' }));
		expect(res.status).toBe(202);
		const waiting = await res.json();
		expect(waiting.status).toBe('needs_mapping');
		expect(waiting.suggestedMapping).toMatchObject({ longitude: 'Longitude', latitude: 'Latitude', moisture: 'Moisture(%)', time: 'Time', speed: 'Speed(mph)' });

		const bad = await mappingApi(jsonEvent(members.manager, 'PUT', `${path}/${waiting.id}/mapping`, { ...params, importId: waiting.id }, { mapping: { ...MAPPING, moisture: 'Grain moisture' } }));
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.fields['mapping.moisture'][0]).toMatch(/^The file has no column "Grain moisture"/);
		const advisor = await mappingApi(jsonEvent(members.advisor, 'PUT', `${path}/${waiting.id}/mapping`, { ...params, importId: waiting.id }, { mapping: MAPPING }));
		expect(advisor.status).toBe(403);

		const ok = await mappingApi(jsonEvent(members.manager, 'PUT', `${path}/${waiting.id}/mapping`, { ...params, importId: waiting.id }, { mapping: MAPPING }));
		expect(ok.status).toBe(202);
		const { body } = await untilFinished(members.owner, path, params, waiting.id);
		expect(body.status).toBe('done');
		expect(body.counts.dropped.passStart).toBe(file.expected.ramp);
		expect(body.lanes[0].meanBushelsPerAcre).toBeCloseTo(200, 9);
		expect(body.lanes[7].meanBushelsPerAcre).toBeCloseTo(60.7, 9);
	});

	it('bad files answer clearly and leave nothing half-stored', async () => {
		const { members, params, path, farm } = await importFarm();
		const post = (csv: string, mapping?: object, source = 'Bad files') => uploadApi(uploadEvent(members.crew, path, params, { csv, source, mapping }));
		const twoColumns = await post('lon,lat\n-94.1,43.9\n');
		expect(twoColumns.status).toBe(400);
		expect((await twoColumns.json()).error.message).toBe('The first line has 2 columns (lon | lat); a yield file needs at least position, yield, moisture and time. Is it separated by commas, semicolons or tabs?');

		const noMoisture = 'Longitude,Latitude,Yld Vol(Dry)(bu/ac),Swath Width(ft),Speed(mph),Time\n-94.1,43.9,200,20,4,2026-10-05T14:00:00Z\n';
		const missing = await post(noMoisture, MAPPING);
		expect(missing.status).toBe(400);
		const missingBody = await missing.json();
		expect(missingBody.error.fields['mapping.moisture'][0]).toBe('The file has no column "Moisture(%)"; its columns are "Longitude", "Latitude", "Yld Vol(Dry)(bu/ac)", "Swath Width(ft)", "Speed(mph)", "Time".');

		// Every point east of the field: the import fails with a reason, and no lane summary is kept.
		const far = generateYieldFile({ lng: LNG + 0.05, lat: LAT, lanes: 8, laneWidthFt: 20, lengthFt: 1000, yieldOf });
		const res = await post(far.csv, MAPPING);
		const { body } = await untilFinished(members.owner, path, params, (await res.json()).id);
		expect(body.status).toBe('failed');
		expect(body.error).toBe(`None of the ${far.expected.total} points lies in a grain lane of this field's plan: is this the right field, or are longitude and latitude swapped?`);
		expect(body.lanes).toEqual([]);
		expect(body.counts).toEqual({});
		expect(await db()('yield_import_files').where({ farm_id: farm.id }).count<{ count: number }[]>('* as count')).toEqual([{ count: 0 }]);

		const huge = new Request(`http://127.0.0.1${path}`, { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(200 * 1024 * 1024) }, body: 'x' });
		const tooBig = await uploadApi({ locals: { user: members.crew, session: null }, url: new URL(`http://127.0.0.1${path}`), params, request: huge, route: { id: path } } as never);
		expect(tooBig.status).toBe(413);
		expect((await tooBig.json()).error.message).toBe(`The file is 200.0 MB; yield files are limited to ${(YIELD_UPLOAD_LIMIT / 1024 / 1024).toFixed(1)} MB (split a larger file by field or by day).`);
	});

	it('advisors and viewers may not import (403); another farm\u2019s ids answer 404', async () => {
		const { members, params, path } = await importFarm();
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 2, laneWidthFt: 20, lengthFt: 1000, yieldOf });
		for (const role of ['advisor', 'viewer'] as const) {
			const res = await uploadApi(uploadEvent(members[role], path, params, { csv: file.csv, source: 'x', mapping: MAPPING }));
			expect(res.status).toBe(403);
		}
		const other = await importFarm();
		expect((await uploadApi(uploadEvent(other.members.owner, path, params, { csv: file.csv, source: 'x', mapping: MAPPING }))).status).toBe(404);
		expect((await listApi(jsonEvent(other.members.owner, 'GET', path, params))).status).toBe(404);
		const mine = await (await uploadApi(uploadEvent(members.owner, path, params, { csv: file.csv, source: 'x', mapping: MAPPING }))).json();
		const peek = await statusApi(jsonEvent(other.members.owner, 'GET', `${path}/${mine.id}`, { ...other.params, importId: mine.id }));
		expect(peek.status).toBe(404);
		await expect(getYieldImport(await requireMember(fakeEvent(other.members.owner), other.farm.id), other.field.id, 2026, mine.id)).rejects.toMatchObject({ status: 404 });
	});
	it('a 100,000-point file goes from upload to per-lane summary in under 10 s', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		const boundary = rectangle(3960, 2640, -94.3, 44.0);
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		const field = await createField(access, { name: 'Big strips', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		await savePlan(access, field.id, 2026, {
			guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 0, variant: 'main', version: 0, assignments: [], notes: null, rebase: false
		});
		const file = generateYieldFile({ lng: -94.3, lat: 44.0, lanes: 198, laneWidthFt: 20, lengthFt: 2640, yieldOf, secondsPerPoint: 0.8, mishaps: true, limit: 100_000 });
		expect(file.expected.total).toBe(100_000);
		const params = { farmId: farm.id, fieldId: field.id, season: '2026' };
		const path = `/api/farms/${farm.id}/fields/${field.id}/seasons/2026/yield-imports`;
		const started = performance.now();
		const res = await uploadApi(uploadEvent(members.crew, path, params, { csv: file.csv, source: 'Big display', mapping: MAPPING }));
		expect(res.status).toBe(202);
		const { body } = await untilFinished(members.owner, path, params, (await res.json()).id);
		const seconds = (performance.now() - started) / 1000;
		expect(body.status).toBe('done');
		expect(body.counts.read).toBe(100_000);
		expect(body.lanes).toHaveLength(199);
		expect(seconds).toBeLessThan(10);
	});
});

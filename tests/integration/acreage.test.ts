// Crop acreage report through its JSON, CSV and PDF routes, against the lanes stored in the database.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { PDFParse } from 'pdf-parse';
import { db } from '$lib/server/db';
import { GET as acreageRoute } from '../../src/routes/api/farms/[farmId]/reports/acreage/+server';
import { GET as csvRoute } from '../../src/routes/api/farms/[farmId]/reports/acreage.csv/+server';
import { GET as pdfRoute } from '../../src/routes/api/farms/[farmId]/reports/acreage.pdf/+server';
import type { SessionUser } from '$lib/server/auth';
import { makeFarmWithTeam, makeUser } from './helpers';
import { logOperation, reportFarm, routeEvent } from './report-setup';

type Row = { fieldId: string; fieldName: string; crop: string; plantedAcres: number; creditedAcres: number; practice: string; plantingDate: string | null; farmNumber: string | null; tractNumber: string | null; fieldNumber: string | null };

type Handler = (event: ReturnType<typeof routeEvent>) => Response | Promise<Response>;

const get = (route: Handler, user: SessionUser | null, farmId: string, query = '?season=2027') =>
	route(routeEvent(user, `/api/farms/${farmId}/reports/acreage${query}`, { farmId }));

async function laneSums(planId: string) {
	const rows = await db()('plan_lanes').where({ plan_id: planId }).select('crop', 'acres', 'width_ft', 'rows');
	const out: Record<string, { planted: number; credited: number }> = {};
	for (const r of rows) {
		const spacing = (Number(r.width_ft) * 12) / r.rows;
		const t = (out[r.crop] ??= { planted: 0, credited: 0 });
		t.planted += Number(r.acres);
		t.credited += Number(r.acres) * (spacing > 40 ? 40 / spacing : 1);
	}
	return out;
}

describe('GET /api/farms/:farmId/reports/acreage', () => {
	it('answers rows per field and crop whose totals equal the sums of the stored lanes', async () => {
		const s = await reportFarm();
		// Planted at 00:30 on 3 May in Minnesota = 05:30 UTC; the report gives the farm's day.
		const cornLanes = s.widePlan.lanes.filter((l) => l.crop === 'corn').map((l) => l.index);
		await logOperation(s, s.wide.id, 'planting', '2027-05-03T05:30:00Z', cornLanes, s.members.crew);
		await logOperation(s, s.wide.id, 'planting', '2027-05-08T15:00:00Z', cornLanes.slice(0, 1), s.members.crew);
		const res = await get(acreageRoute, s.members.owner, s.farm.id);
		expect(res.status).toBe(200);
		const body = (await res.json()) as { rows: Row[]; totals: Record<string, { plantedAcres: number; creditedAcres: number }>; warnings: string[] };

		const wide = await laneSums(s.widePlan.id);
		const strips = await laneSums(s.stripPlan.id);
		expect(body.rows.map((r) => [r.fieldName, r.crop, r.practice, r.plantingDate, r.farmNumber, r.tractNumber, r.fieldNumber])).toEqual([
			['Strips', 'corn', 'strips', null, '4410', '1208', '1'],
			['Strips', 'soybean', 'strips', null, '4410', '1208', '1'],
			['Wide rows', 'corn', 'wide rows', '2027-05-03', '4410', '1207', '2'],
			['Wide rows', 'soybean', 'strips', null, '4410', '1207', '2']
		]);
		const row = (field: string, crop: string) => body.rows.find((r) => r.fieldName === field && r.crop === crop)!;
		expect(row('Wide rows', 'corn').plantedAcres).toBeCloseTo(wide.corn.planted, 2);
		// 60-in twin-row centres: two thirds of the corn acres count (7 CFR 718.108).
		expect(row('Wide rows', 'corn').creditedAcres).toBeCloseTo((wide.corn.planted * 2) / 3, 2);
		expect(row('Strips', 'soybean').creditedAcres).toBeCloseTo(strips.soybean.planted, 2);
		expect(body.totals.corn.plantedAcres).toBeCloseTo(wide.corn.planted + strips.corn.planted, 2);
		expect(body.totals.corn.creditedAcres).toBeCloseTo(wide.corn.credited + strips.corn.credited, 2);
		expect(body.totals.soybean.plantedAcres).toBeCloseTo(wide.soybean.planted + strips.soybean.planted, 2);
		expect(Object.keys(body.totals).sort()).toEqual(['corn', 'soybean']);
		expect(body.warnings).toEqual([
			'Strips: no planting record for corn, soybean in 2027; log the planting in the record book so the report carries its date.',
			'Wide rows: no planting record for soybean in 2027; log the planting in the record book so the report carries its date.'
		]);
	});

	it('leaves out deleted planting records and answers an empty season with a warning', async () => {
		const s = await reportFarm();
		const op = await logOperation(s, s.strips.id, 'planting', '2027-04-28T15:00:00Z', [0], s.members.crew);
		await db()('operations').where({ id: op.id }).update({ deleted_at: new Date() });
		const body = await (await get(acreageRoute, s.members.owner, s.farm.id)).json();
		expect(body.rows.find((r: Row) => r.fieldName === 'Strips' && r.crop === 'corn').plantingDate).toBeNull();
		const empty = await (await get(acreageRoute, s.members.owner, s.farm.id, '?season=2031')).json();
		expect(empty).toEqual({
			season: 2031,
			rows: [],
			totals: {},
			byLandlord: {},
			warnings: ['No field has an adopted plan for 2031, so there are no acres to report. Adopt a plan for each field first.']
		});
	});

	it('shows a viewer only the granted field, and every member may read', async () => {
		const s = await reportFarm();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.strips.id] });
		const viewer = await (await get(acreageRoute, s.members.viewer, s.farm.id)).json();
		expect([...new Set(viewer.rows.map((r: Row) => r.fieldId))]).toEqual([s.strips.id]);
		expect(Object.keys(viewer.byLandlord)).toEqual(['No landlord named']);
		for (const role of ['manager', 'crew', 'advisor'] as const) expect((await get(acreageRoute, s.members[role], s.farm.id)).status).toBe(200);
	});

	it('refuses strangers and other farms with 404, no session with 401, a bad season with 400', async () => {
		const s = await reportFarm();
		const other = await makeFarmWithTeam();
		const stranger = await makeUser('stranger');
		expect((await get(acreageRoute, stranger, s.farm.id)).status).toBe(404);
		expect((await get(acreageRoute, other.members.owner, s.farm.id)).status).toBe(404);
		expect((await get(csvRoute, other.members.owner, s.farm.id)).status).toBe(404);
		expect((await get(pdfRoute, other.members.owner, s.farm.id)).status).toBe(404);
		expect((await get(acreageRoute, null, s.farm.id)).status).toBe(401);
		const missing = await get(acreageRoute, s.members.owner, s.farm.id, '');
		expect(missing.status).toBe(400);
		expect((await missing.json()).error).toEqual({
			code: 'invalid',
			message: 'Say which season: add ?season= with a crop year, e.g. ?season=2027.',
			fields: { season: ['Give a crop year (four digits).'] }
		});
		expect((await get(acreageRoute, s.members.owner, s.farm.id, '?season=27')).status).toBe(400);
	});
});

describe('acreage.csv and acreage.pdf', () => {
	it('CSV parses back to the same rows and totals as the JSON', async () => {
		const s = await reportFarm();
		const json = await (await get(acreageRoute, s.members.owner, s.farm.id)).json();
		const res = await get(csvRoute, s.members.owner, s.farm.id);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const parsed = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true });
		expect(parsed.errors).toEqual([]);
		const lines = parsed.data.filter((l) => l.Field !== 'Total');
		expect(lines.map((l) => [l.Field, l.Crop, Number(l['Planted (ac)']), Number(l['Credited (ac)']), l['Farm number'], l['Tract number']])).toEqual(
			json.rows.map((r: Row) => [r.fieldName, r.crop, r.plantedAcres, r.creditedAcres, r.farmNumber, r.tractNumber])
		);
		const totals = parsed.data.filter((l) => l.Field === 'Total');
		expect(totals.map((l) => [l.Crop, Number(l['Planted (ac)']), Number(l['Credited (ac)'])])).toEqual(
			Object.entries(json.totals).map(([crop, t]) => [crop, (t as { plantedAcres: number }).plantedAcres, (t as { creditedAcres: number }).creditedAcres])
		);
	});

	it('PDF carries the title, each row and the crop totals', async () => {
		const s = await reportFarm();
		const json = await (await get(acreageRoute, s.members.owner, s.farm.id)).json();
		const res = await get(pdfRoute, s.members.owner, s.farm.id);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		const parser = new PDFParse({ data: new Uint8Array(await res.arrayBuffer()) });
		const text = (await parser.getText()).text;
		await parser.destroy();
		expect(text).toContain('Crop acreage 2027');
		expect(text).toContain('Totals by crop');
		expect(text).toContain('Landlord: Landlord one');
		expect(text).toContain('7 CFR 718.108');
		const wideCorn = json.rows.find((r: Row) => r.fieldName === 'Wide rows' && r.crop === 'corn');
		expect(text).toMatch(new RegExp(`(^|\\s)${wideCorn.creditedAcres.toFixed(2)} ac(\\s|$)`));
		expect(text).toMatch(new RegExp(`(^|\\s)${json.totals.soybean.plantedAcres.toFixed(2)} ac(\\s|$)`));
	});
});

// Landlord summary per field and season: what it holds, and that a viewer granted one field never
// sees another field's summary, in JSON or PDF.
import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { db } from '$lib/server/db';
import type { SessionUser } from '$lib/server/auth';
import { GET as summaryRoute } from '../../src/routes/api/farms/[farmId]/reports/landlord/[fieldId]/+server';
import { GET as pdfRoute } from '../../src/routes/api/farms/[farmId]/reports/landlord/[fieldId]/summary.pdf/+server';
import { makeFarmWithTeam } from './helpers';
import { createHarvestEntry } from '$lib/server/harvest';
import { logOperation, reportFarm, routeEvent } from './report-setup';

type Handler = (event: ReturnType<typeof routeEvent>) => Response | Promise<Response>;
const get = (route: Handler, user: SessionUser | null, farmId: string, fieldId: string, query = '?season=2027') =>
	route(routeEvent(user, `/api/farms/${farmId}/reports/landlord/${fieldId}${query}`, { farmId, fieldId }));

async function pdfText(res: Response) {
	const parser = new PDFParse({ data: new Uint8Array(await res.arrayBuffer()) });
	const text = (await parser.getText()).text;
	await parser.destroy();
	return text;
}

async function withRecords() {
	const s = await reportFarm();
	const corn = s.widePlan.lanes.filter((l) => l.crop === 'corn').map((l) => l.index);
	const planting = await logOperation(s, s.wide.id, 'planting', '2027-05-03T14:00:00Z', corn, s.members.crew);
	const sidedress = await logOperation(s, s.wide.id, 'fertilizer', '2027-06-10T15:00:00Z', corn, s.members.crew, [{ name: 'UAN 32 %', rate: 15, rateUnit: 'gal/ac', totalUnit: 'gal' }]);
	// A record on the other field, which the wide field's summary must never show.
	await logOperation(s, s.strips.id, 'spraying', '2027-06-01T15:00:00Z', [0], s.members.crew, [{ name: 'residual herbicide A', rate: 1.5, rateUnit: 'pt/ac', totalUnit: 'pt' }]);
	return { ...s, corn, planting, sidedress };
}

describe('landlord summary', () => {
	it('holds the outline, lanes, acres by crop, records with rates and totals, and harvest', async () => {
		const s = await withRecords();
		const res = await get(summaryRoute, s.members.owner, s.farm.id, s.wide.id);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect([body.field.name, body.field.landlord, body.field.farmNumber, body.field.tractNumber, body.field.fieldNumber]).toEqual(['Wide rows', 'Landlord one', '4410', '1207', '2']);
		expect(body.field.boundary).toEqual(s.wide.boundary);
		expect(body.plan.lanes.map((l: { index: number; crop: string }) => [l.index, l.crop])).toEqual(s.widePlan.lanes.map((l) => [l.index, l.crop]));
		const cornAcres = s.widePlan.lanes.filter((l) => l.crop === 'corn').reduce((sum, l) => sum + l.acres, 0);
		const corn = body.byCrop.find((c: { crop: string }) => c.crop === 'corn');
		expect(corn.acres).toBeCloseTo(cornAcres, 2);
		expect(corn.creditedAcres).toBeCloseTo((cornAcres * 2) / 3, 2);
		expect(body.operations.map((o: { type: string; startedOn: string; lanes: number[] }) => [o.type, o.startedOn, o.lanes])).toEqual([
			['planting', '2027-05-03', s.corn.map((i) => i + 1)],
			['fertilizer', '2027-06-10', s.corn.map((i) => i + 1)]
		]);
		const [uan] = body.operations[1].products;
		expect([uan.name, uan.rate, uan.rateUnit, uan.totalUnit]).toEqual(['UAN 32 %', 15, 'gal/ac', 'gal']);
		expect(uan.total).toBeCloseTo(15 * s.sidedress.acres, 3);
		expect(JSON.stringify(body)).not.toContain('residual herbicide A');
		expect(body.harvest).toEqual([]);
	});

	it('carries the field\u2019s harvest entries as bushels and bushels per acre by crop, JSON and PDF', async () => {
		const s = await withRecords();
		const [first, second] = s.corn;
		const a = await createHarvestEntry(s.access, s.wide.id, 2027, { laneIndexes: [first], crop: 'corn', wetWeightLb: 6000, moisturePct: 19 });
		const b = await createHarvestEntry(s.access, s.wide.id, 2027, { laneIndexes: [second], crop: 'corn', wetWeightLb: 5400, moisturePct: 16 });
		const body = await (await get(summaryRoute, s.members.owner, s.farm.id, s.wide.id)).json();
		const bushels = a.bushels + b.bushels;
		const acres = a.harvestedAcres + b.harvestedAcres;
		expect(body.harvest).toHaveLength(1);
		expect(body.harvest[0]).toMatchObject({ crop: 'corn', entries: 2, standardMoisturePct: 15.5 });
		expect(body.harvest[0].bushels).toBeCloseTo(bushels, 1);
		expect(body.harvest[0].bushelsPerAcre).toBeCloseTo(bushels / acres, 1);
		const text = await pdfText(await get(pdfRoute, s.members.owner, s.farm.id, s.wide.id));
		expect(text).toContain(`${body.harvest[0].bushelsPerAcre.toLocaleString('en-US')} bu/ac at 15.5 %`);
	});

	it('PDF names the field, its crops and the logged rate', async () => {
		const s = await withRecords();
		const res = await get(pdfRoute, s.members.advisor, s.farm.id, s.wide.id);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		const text = await pdfText(res);
		expect(text).toContain('Wide rows · 2027 season summary');
		expect(text).toContain('Acres by crop');
		expect(text).toMatch(/UAN 32 %: 15 gal\/ac, [\d,.]+ gal/);
		expect(text).toContain('the label is the law');
		expect(text).not.toContain('residual herbicide A');
	});

	it('a viewer granted one field reads its summary and never another field (404, JSON and PDF)', async () => {
		const s = await withRecords();
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.wide.id] });
		expect((await get(summaryRoute, s.members.viewer, s.farm.id, s.wide.id)).status).toBe(200);
		expect((await get(pdfRoute, s.members.viewer, s.farm.id, s.wide.id)).status).toBe(200);
		const refused = await get(summaryRoute, s.members.viewer, s.farm.id, s.strips.id);
		expect(refused.status).toBe(404);
		const body = await refused.json();
		expect(body.error.code).toBe('not_found');
		expect(JSON.stringify(body)).not.toContain('Strips');
		expect((await get(pdfRoute, s.members.viewer, s.farm.id, s.strips.id)).status).toBe(404);
		// With no field granted, nothing at all.
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [] });
		expect((await get(summaryRoute, s.members.viewer, s.farm.id, s.wide.id)).status).toBe(404);
	});

	it('another farm, no session and a missing season are refused', async () => {
		const s = await withRecords();
		const other = await makeFarmWithTeam();
		expect((await get(summaryRoute, other.members.owner, s.farm.id, s.wide.id)).status).toBe(404);
		expect((await get(summaryRoute, other.members.owner, other.farm.id, s.wide.id)).status).toBe(404);
		expect((await get(summaryRoute, null, s.farm.id, s.wide.id)).status).toBe(401);
		expect((await get(summaryRoute, s.members.owner, s.farm.id, s.wide.id, '')).status).toBe(400);
	});

	it('a season with no plan says so instead of failing', async () => {
		const s = await reportFarm();
		const body = await (await get(summaryRoute, s.members.owner, s.farm.id, s.strips.id, '?season=2020')).json();
		expect([body.plan, body.byCrop, body.operations]).toEqual([null, [], []]);
		const text = await pdfText(await get(pdfRoute, s.members.owner, s.farm.id, s.strips.id, '?season=2020'));
		expect(text).toContain('No plan was adopted for 2020, so there are no lanes to show.');
		expect(text).toContain('No records were logged on this field for 2020.');
	});
});

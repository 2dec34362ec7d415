// The landlord summary names the work as the record book does ("Cover seeding", not the stored
// key) and counts weighed loads with their unit.
import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { GET as pdfRoute } from '../../src/routes/api/farms/[farmId]/reports/landlord/[fieldId]/summary.pdf/+server';
import { createHarvestEntry } from '$lib/server/harvest';
import { logOperation, reportFarm, routeEvent } from './report-setup';

describe('landlord summary PDF words', () => {
	it('writes the kind of work in words and the weighed loads with their unit', async () => {
		const s = await reportFarm();
		const corn = s.widePlan.lanes.filter((l) => l.crop === 'corn').map((l) => l.index);
		await logOperation(s, s.wide.id, 'cover-seeding', '2027-06-15T15:00:00Z', corn, s.members.crew);
		await createHarvestEntry(s.access, s.wide.id, 2027, { laneIndexes: [corn[0]], crop: 'corn', wetWeightLb: 6000, moisturePct: 19 });
		await createHarvestEntry(s.access, s.wide.id, 2027, { laneIndexes: [corn[1]], crop: 'corn', wetWeightLb: 5400, moisturePct: 16 });
		const res = await pdfRoute(routeEvent(s.members.owner, `/api/farms/${s.farm.id}/reports/landlord/${s.wide.id}/summary.pdf?season=2027`, { farmId: s.farm.id, fieldId: s.wide.id }));
		expect(res.status).toBe(200);
		const parser = new PDFParse({ data: new Uint8Array(await res.arrayBuffer()) });
		const text = (await parser.getText()).text;
		await parser.destroy();
		expect(text).toContain('Cover seeding');
		expect(text).not.toContain('cover-seeding');
		expect(text).toMatch(/\b2 loads\b/);
	});
});

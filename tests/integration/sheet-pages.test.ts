import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { createEquipment } from '$lib/server/equipment';
import { createVariety } from '$lib/server/varieties';
import { loadSheet } from '$lib/server/sheet';
import { renderSheetPdf } from '$lib/server/sheet-pdf';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { fakeEvent, makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// The cab sheet fits one sheet of paper, front and back, for fields up to 100 lanes; the full
// lists print only when asked.

const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';
const NORTH_80 = '5a1e0000-0000-4000-8000-0000000001f1';

async function pdfPages(pdf: Buffer): Promise<string[]> {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	try {
		return (await parser.getText()).pages.map((p) => p.text);
	} finally {
		await parser.destroy();
	}
}

/** A split planter with row unit 9's nitrogen left open over soybean, a drill and a sprayer. */
const equipment = [
	{
		name: '16-row split', kind: 'planter' as const, workingWidthFt: 40, isDefaultPlanter: true, sections: null, rows: null, lengthFt: null, notes: null,
		planter: {
			rowSpacingIn: 30,
			fertilizerLines: [{ id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 }],
			rowUnits: Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: { crop: i < 8 ? 'corn' : 'soybean', variety: i < 8 ? 'hybrid P' : 'line P' }, fertilizerOn: i <= 8 ? ['n'] : [] }))
		}
	},
	{ name: '15-ft drill', kind: 'drill' as const, workingWidthFt: 15, isDefaultPlanter: false, sections: null, rows: null, lengthFt: null, notes: null, planter: null },
	{ name: '60-ft sprayer', kind: 'sprayer' as const, workingWidthFt: 60, isDefaultPlanter: false, sections: 6, rows: null, lengthFt: null, notes: null, planter: null }
];

async function hundredLanePlan() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	// 1,990 ft of 20-ft lanes: 99 whole and a 10-ft last one.
	const boundary = rectangle(1990, 1320, -94.3, 43.8);
	const field = await createField(access, { name: 'Hundred lanes', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const plan = await savePlan(access, field.id, 2027, {
		guidance: { a: sw, b: nw },
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, version: 0, variant: 'main', assignments: [], notes: null, rebase: false
	});
	await savePlan(access, field.id, 2027, {
		guidance: { a: sw, b: nw },
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, version: plan.version, variant: 'main', notes: null, rebase: false,
		assignments: plan.lanes.map((l) => ({ laneIndex: l.index, variety: l.crop === 'corn' ? 'hybrid P' : 'line P', populationPerAcre: l.crop === 'corn' ? 34_000 : 140_000, relativeMaturity: null, seedLot: null, trialLabel: null, notes: null }))
	});
	for (const e of equipment) await createEquipment(access, e);
	// The catalogue's own seeds per unit for the corn (a 50,000-seed unit), none for the soybean.
	await createVariety(access, { crop: 'corn', name: 'hybrid P', relativeMaturity: 104, seedsPerUnit: 50_000, traits: null, notes: null });
	return { access, field };
}

async function demoAccess() {
	const owner = await db()('memberships').join('users', 'users.id', 'memberships.user_id').where({ farm_id: DEMO_FARM_ID, role: 'owner' }).first('users.id', 'users.name', 'users.email');
	return requireMember(fakeEvent({ id: owner.id, name: owner.name, email: owner.email } as never), DEMO_FARM_ID, 'read');
}

/** Every field and season of the demo farm with an adopted plan. */
async function demoPlans(): Promise<{ fieldId: string; name: string; season: number }[]> {
	return db()('plans as p')
		.join('fields as f', 'f.id', 'p.field_id')
		.where({ 'f.farm_id': DEMO_FARM_ID, 'p.adopted': true })
		.orderBy([{ column: 'f.name' }, { column: 'p.season' }])
		.select('f.id as fieldId', 'f.name as name', 'p.season as season');
}

describe('the cab sheet on one sheet of paper', () => {
	it('prints every demo field and season with an adopted plan on two pages, with every pass ticked and the full lists in the appendix', async () => {
		const access = await demoAccess();
		const plans = await demoPlans();
		// The demo's three fields, each with adopted plans for 2026 and 2027 at least.
		for (const name of ['Creek Bend', 'North 80', 'Shelter Lanes']) {
			expect(plans.filter((p) => p.name === name).map((p) => p.season)).toEqual(expect.arrayContaining([2026, 2027]));
		}
		const counts: string[] = [];
		for (const plan of plans) {
			const sheet = await loadSheet(access, plan.fieldId, plan.season);
			const pages = await pdfPages(await renderSheetPdf(sheet, { timeZone: 'America/Chicago' }));
			counts.push(`${plan.name} ${plan.season}: ${pages.length}`);
			const text = pages.join('\n');
			const flat = text.replace(/\s+/g, ' ');
			// Every STOP item whole in the box, every caution, every pass once in the grid.
			for (const stop of sheet.checkGroups!.filter((g) => g.severity === 'stop')) expect(flat).toContain(stop.summary.replace(/\s+/g, ' '));
			for (const caution of sheet.cautions) expect(flat).toContain(caution);
			const passNumbers = [...text.matchAll(/(?:^| )(\d+) [AB] (?:\d+(?:–\d+)?(?:, \d+)*|none)(?: \*)? (?:[a-z]\d?|\d+)(?= |$)/gm)].map((m) => Number(m[1]));
			expect(passNumbers).toEqual(sheet.passes.map((p) => p.number));

			const full = await pdfPages(await renderSheetPdf(sheet, { timeZone: 'America/Chicago', appendix: true }));
			const appendix = full.slice(pages.length).join('\n');
			expect(appendix).toContain('Appendix: the full lists');
			expect(appendix.match(/^Lane \d+ (crop|pasture|cover|buffer) /gm)).toHaveLength(sheet.lanes.length);
			expect(appendix.match(/^Pass \d+ from [AB] /gm)).toHaveLength(sheet.passes.length);
		}
		expect(counts.filter((c) => !c.endsWith(': 1') && !c.endsWith(': 2'))).toEqual([]);
	}, 120_000);

	it('names each setup of a planter that does not suit its lanes by a letter, each pass with its own tick box', async () => {
		const access = await demoAccess();
		const creek = (await demoPlans()).find((p) => p.name === 'Creek Bend' && p.season === 2027)!;
		const sheet = await loadSheet(access, creek.fieldId, 2027);
		expect(sheet.lanes).toHaveLength(33);
		expect(sheet.passes).toHaveLength(139);
		const pages = await pdfPages(await renderSheetPdf(sheet, { timeZone: 'America/Chicago' }));
		expect(pages).toHaveLength(2);
		const text = pages.join('\n');
		expect(text).toContain('Passes, 139 in driving order: read across, tick each when done');
		expect(text).toMatch(/^1 A 1 a 2 B 1 b 3 A 1–2 a 4 B 1–2 c 5 A 2 d 6 B 1–2 c$/m);
		expect(text).toMatch(/a · 4 on: units 1, 3, 5 and 7 corn \(hybrid A \(105-day\)\)/);
		expect(text).toMatch(/c · 1 on: unit 8 corn \(hybrid A \(105-day\)\)/);
		expect(text).toMatch(/^STOP: 1 problem to fix before planting$/m);
		// Quantities keep their units beside the hazards.
		expect(text.replace(/\s+/g, ' ')).toMatch(/Nitrogen \(UAN 32 %\) [\d,.]+ gal · [\d,.]+ lb N/);
	});

	it('prints the demo 63-lane plan on two pages, and every finding, lane and pass in the appendix', async () => {
		const access = await demoAccess();
		const sheet = await loadSheet(access, NORTH_80, 2027);
		expect(sheet.lanes).toHaveLength(63);
		const pages = await pdfPages(await renderSheetPdf(sheet, { timeZone: 'America/Chicago' }));
		expect(pages.length).toBeLessThanOrEqual(2);
		const text = pages.join('\n');
		const flat = text.replace(/\s+/g, ' ');
		// STOP first and whole; each kind of problem said once with what it costs.
		expect(pages[0]).toContain('STOP: 1 problem to fix before planting');
		expect(flat).toMatch(/Nitrogen \(UAN 32 %\) is on at row unit 9 over 31 soybean lanes \(2, 4, 6 … 62\)/);
		expect(flat).toMatch(/30 passes \(2, 3, 4 … 31\) start from the same end as the pass before: 30 empty returns, about \d+ miles driven with the planter raised/);
		expect(flat).toMatch(/15-ft drill: 63 lanes \(1, 2, 3 … 63\), 20 ft each: 2 passes a lane, the last overlapping the one before \(it covers 33 % of its width\); about \d+ ac covered twice/);
		expect(text).not.toMatch(/Pass \d+ starts from A again/);
		// Every pass keeps its tick box, four to a row; lanes set up alike share a row.
		expect(text).toMatch(/^1 A 1–2 16 2 A 3–4 16 3 A 5–6 16 4 A 7–8 16$/m);
		expect(text).toMatch(/^29 A 57–58 16 30 A 59–60 16 31 A 61–62 16 32 B 62–63 \* 8$/m);
		expect(flat).toContain('* Pass 32: units 1–8 corn (hybrid A (105-day)); units 9–16 off.');
		expect(flat).toContain('Lanes 1, 3, 5 … 63 (32) corn 20 ft 8 × 30 in');
		expect(text).not.toMatch(/^Lane 7 crop /m);
		for (const caution of sheet.cautions) expect(flat).toContain(caution);

		const full = await pdfPages(await renderSheetPdf(sheet, { timeZone: 'America/Chicago', appendix: true }));
		expect(full.length).toBeGreaterThan(2);
		const appendix = full.slice(pages.length).join('\n');
		expect(appendix).toContain('Appendix: the full lists');
		expect(appendix.match(/^Lane \d+ crop (corn|soybean) 20 ft /gm)).toHaveLength(63);
		expect(appendix.match(/Pass \d+ starts from A again, like pass \d+/g)).toHaveLength(30);
		expect(appendix.match(/15-ft drill: Lane \d+ \((corn|soybean)\), 20 ft: 2 passes/g)).toHaveLength(63);
		expect(appendix.match(/^Pass \d+ from [AB] /gm)).toHaveLength(sheet.passes.length);
	});

	it('prints a 100-lane plan on two pages with the catalogue\'s seeds per unit', async () => {
		const { access, field } = await hundredLanePlan();
		const sheet = await loadSheet(access, field.id, 2027);
		expect(sheet.lanes).toHaveLength(100);
		expect(sheet.passes.length).toBeGreaterThanOrEqual(50);
		const pages = await pdfPages(await renderSheetPdf(sheet));
		expect(pages.length).toBeLessThanOrEqual(2);
		const flat = pages.join(' ').replace(/\s+/g, ' ');
		expect(flat).toContain('STOP: 1 problem to fix before planting');
		expect(flat).toMatch(/over 50 soybean lanes \(2, 4, 6 … 100\)/);
		expect(pages.join('\n').match(/^\d+ [AB] \d+–\d+ 16 \d+ [AB] \d+–\d+ 16 \d+ [AB] \d+–\d+ 16 \d+ [AB] \d+–\d+ 16$/gm)).toHaveLength(12);
		// Corn units from the catalogue (50,000 seeds), soybean from the usual preset.
		const corn = sheet.quantities.find((q) => q.label.startsWith('Corn'));
		expect(corn?.detail).toContain('÷ 50,000 seeds per unit (seed catalogue)');
		const soy = sheet.quantities.find((q) => q.label.startsWith('Soybean'));
		expect(soy?.detail).toContain('seeds per unit (common practice)');

		const full = await pdfPages(await renderSheetPdf(sheet, { appendix: true }));
		const appendix = full.slice(pages.length).join('\n');
		expect(appendix.match(/^Lane \d+ crop (corn|soybean) 20 ft /gm)).toHaveLength(100);
		expect(appendix.match(/^Pass \d+ from [AB] /gm)).toHaveLength(50);
	});
});

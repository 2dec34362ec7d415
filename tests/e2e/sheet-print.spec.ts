import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { PDFParse } from 'pdf-parse';
import { DEMO_FARM_ID, apiSignIn } from './helpers';
import { CORN_8, SOYBEAN_8, ownFarm, ownField, ownPlan } from './own-farm';
import { rectangle } from '../fixtures/rectangle';

// The cab sheet fits one sheet of paper, front and back (two Letter pages), for fields up to 100
// lanes, printed from the page and as the PDF; the full lists print only when asked. The demo is
// only read here; the 100-lane field belongs to a farm the test makes.

const NORTH_80 = `/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f1`;

async function pdfPages(pdf: Buffer): Promise<string[]> {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	try {
		return (await parser.getText()).pages.map((p) => p.text);
	} finally {
		await parser.destroy();
	}
}

/** The page as Chromium prints it on Letter paper with ordinary printer margins. */
async function printed(page: Page): Promise<string[]> {
	await page.emulateMedia({ media: 'print' });
	const pdf = await page.pdf({ format: 'Letter', margin: { top: '0.4in', bottom: '0.4in', left: '0.4in', right: '0.4in' } });
	await page.emulateMedia({ media: 'screen' });
	return pdfPages(pdf);
}

async function sheetPdf(request: APIRequestContext, path: string): Promise<string[]> {
	const res = await request.get(path);
	expect(res.status()).toBe(200);
	return pdfPages(await res.body());
}

test('every demo field and season with an adopted plan prints on two pages, page and PDF; the full lists keep every lane and pass', async ({ page }) => {
	test.setTimeout(240_000);
	await apiSignIn(page.request, 'manager');
	// The seeded fields only: other tests may add fields of their own to the demo farm.
	const seeded = ['5a1e0000-0000-4000-8000-0000000001f1', '5a1e0000-0000-4000-8000-0000000001f2', '5a1e0000-0000-4000-8000-0000000001f3'];
	const all = (await (await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields`)).json()) as { id: string; name: string }[];
	const fields = all.filter((f) => seeded.includes(f.id));
	expect(fields).toHaveLength(3);
	const sheets: { field: { id: string; name: string }; season: number }[] = [];
	for (const field of fields) {
		const plans = (await (await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields/${field.id}/plans`)).json()) as { season: number; adopted: boolean }[];
		for (const plan of plans.filter((p) => p.adopted)) sheets.push({ field, season: plan.season });
	}
	for (const name of ['Creek Bend', 'North 80', 'Shelter Lanes']) {
		expect(sheets.filter((s) => s.field.name === name).map((s) => s.season)).toEqual(expect.arrayContaining([2026, 2027]));
	}
	const counts: Record<string, [number, number]> = {};
	for (const { field, season } of sheets) {
		const path = `/farms/${DEMO_FARM_ID}/fields/${field.id}/plans/${season}/sheet`;
		const pdfPath = `/api/farms/${DEMO_FARM_ID}/fields/${field.id}/plans/${season}/sheet.pdf`;
		await page.goto(path);
		await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Seeding sheet — ${field.name} ${season}`);
		const onPage = (await printed(page)).length;
		const asPdf = (await sheetPdf(page.request, pdfPath)).length;
		counts[`${field.name} ${season}`] = [onPage, asPdf];
		// Every pass keeps its own tick box on the sheet.
		const ticks = await page.getByTestId('sheet-passes').getByRole('checkbox').count();

		const full = (await sheetPdf(page.request, `${pdfPath}?appendix=1`)).join('\n');
		const lanes = full.match(/^Lane \d+ (crop|pasture|cover|buffer) /gm)?.length ?? 0;
		const passes = full.match(/^Pass \d+ from [AB] /gm)?.length ?? 0;
		const plan = (await (await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields/${field.id}/plans/${season}`)).json()) as { lanes: unknown[] };
		expect(ticks, `${field.name} ${season}`).toBe(passes);
		expect(passes, `${field.name} ${season}`).toBeGreaterThan(0);
		expect(lanes, `${field.name} ${season}`).toBe(plan.lanes.length);
		await page.goto(`${path}?appendix=1`);
		await expect(page.getByTestId('sheet-appendix')).toContainText('Appendix: the full lists');
		if (lanes > 24) await expect(page.getByTestId('sheet-lanes-all').locator('tbody tr')).toHaveCount(lanes);
		if (passes > 24) await expect(page.getByTestId('sheet-passes-all').locator('li')).toHaveCount(passes);
	}
	const over = Object.entries(counts).filter(([, [p, d]]) => p > 2 || d > 2);
	expect(over, JSON.stringify(counts)).toEqual([]);
});

test('a planter that does not suit its lanes gets a setup letter on each of its 139 passes', async ({ page }) => {
	await apiSignIn(page.request, 'manager');
	const fields = (await (await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields`)).json()) as { id: string; name: string }[];
	const creek = fields.find((f) => f.name === 'Creek Bend')!;
	await page.goto(`/farms/${DEMO_FARM_ID}/fields/${creek.id}/plans/2027/sheet`);
	const passes = page.getByTestId('sheet-passes').locator('li');
	await expect(passes).toHaveCount(139);
	await expect(passes.first()).toHaveText('Pass 1 A 1 a');
	await expect(passes.first().getByRole('checkbox', { name: 'Pass 1 done' })).toBeVisible();
	await expect(page.getByTestId('sheet-setups').locator('li').first()).toHaveText('a · 4 on: units 1, 3, 5 and 7 corn (hybrid A (105-day))');
	expect((await printed(page)).length).toBeLessThanOrEqual(2);
});

test('the demo 63-lane sheet prints on two pages; "Print the full lists" adds every lane, pass and finding', async ({ page }) => {
	await apiSignIn(page.request, 'manager');
	await page.goto(`${NORTH_80}/plans/2027/sheet`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Seeding sheet — North 80 2027');
	// Each kind of problem once, with what it costs; the STOP item stays on top.
	await expect(page.getByTestId('sheet-stops')).toContainText('Nitrogen (UAN 32 %) is on at row unit 9 over 31 soybean lanes (2, 4, 6 … 62)');
	const checks = page.getByTestId('sheet-checks');
	await expect(checks).toContainText(/30 passes \(2, 3, 4 … 31\) start from the same end as the pass before: 30 empty returns, about \d+ miles driven/);
	await expect(checks.getByText(/starts from A again/).first()).toBeHidden();
	await expect(page.getByTestId('sheet-passes').locator('li')).toHaveCount(32);
	await expect(page.getByTestId('sheet-lanes').locator('tbody tr')).toHaveCount(2);
	// The full list of a kind opens in place.
	const drill = checks.locator('li[data-kind="partial_pass"]').filter({ hasText: '15-ft drill' });
	await drill.getByText('List each one (63)').click();
	await expect(drill.getByTestId('warning-details').locator('li')).toHaveCount(63);

	const pages = await printed(page);
	expect(pages.length).toBeLessThanOrEqual(2);
	expect(pages.join('\n')).toContain('STOP: 1 problem to fix before planting');
	expect(pages.join('\n')).not.toContain('Appendix: the full lists');

	await page.getByTestId('appendix-toggle').click();
	await expect(page).toHaveURL(/[?&]appendix=1\b/);
	await expect(page.getByTestId('appendix-toggle')).toHaveAttribute('aria-checked', 'true');
	await expect(page.getByTestId('sheet-lanes-all').locator('tbody tr')).toHaveCount(63);
	await expect(page.getByTestId('sheet-passes-all').locator('li')).toHaveCount(32);
	const full = await printed(page);
	expect(full.length).toBeGreaterThan(2);
	const appendix = full.slice(2).join('\n');
	expect(appendix).toContain('Appendix: the full lists');
	expect(appendix.match(/Pass \d+ starts from A again, like pass \d+/g)).toHaveLength(30);

	// The PDF link carries the choice; the PDF alone stays at two pages.
	const pdfPath = `/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f1/plans/2027/sheet.pdf`;
	await expect(page.getByRole('link', { name: 'Download PDF' })).toHaveAttribute('href', `${pdfPath}?appendix=1`);
	expect((await sheetPdf(page.request, pdfPath)).length).toBeLessThanOrEqual(2);
	const withLists = (await sheetPdf(page.request, `${pdfPath}?appendix=1`)).join('\n');
	expect(withLists.match(/^Lane \d+ crop (corn|soybean) 20 ft /gm)).toHaveLength(63);
});

test('a 100-lane field of the tester\'s own farm prints on two pages, page and PDF', async ({ page, baseURL }) => {
	const farm = await ownFarm(page, 'sheet-print');
	// 1,990 ft of 20-ft lanes: 99 whole and a 10-ft last one.
	const boundary = rectangle(1990, 1320, -94.33, 43.74);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const fieldId = await ownField(page.request, farm.farmId, 'Hundred lanes', boundary);
	const plan = await ownPlan(page.request, farm.farmId, fieldId, 2027, { guidance: { a: sw, b: nw }, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	expect(plan.lanes).toHaveLength(100);
	// A split planter with row unit 9's nitrogen left open over soybean, through the equipment form.
	const setup = {
		rowSpacingIn: 30,
		fertilizerLines: [{ id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 }],
		rowUnits: Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: { crop: i < 8 ? 'corn' : 'soybean', variety: null }, fertilizerOn: i <= 8 ? ['n'] : [] }))
	};
	const made = await page.request.post(`/farms/${farm.farmId}/equipment/new?/create`, {
		form: { name: 'Split planter', kind: 'planter', isDefaultPlanter: 'on', setup: JSON.stringify(setup) },
		headers: { origin: new URL(baseURL!).origin },
		maxRedirects: 0
	});
	expect(made.status(), await made.text()).toBeLessThan(400);

	await page.goto(`/farms/${farm.farmId}/fields/${fieldId}/plans/2027/sheet`);
	await expect(page.getByTestId('sheet-stops')).toContainText('over 50 soybean lanes (2, 4, 6 … 100)');
	await expect(page.getByTestId('sheet-passes').locator('li').first()).toContainText('Pass 1');
	expect(await page.getByTestId('sheet-passes').locator('li').count()).toBeGreaterThanOrEqual(50);
	expect((await printed(page)).length).toBeLessThanOrEqual(2);

	const pdfPath = `/api/farms/${farm.farmId}/fields/${fieldId}/plans/2027/sheet.pdf`;
	expect((await sheetPdf(page.request, pdfPath)).length).toBeLessThanOrEqual(2);
	await page.getByTestId('appendix-toggle').click();
	await expect(page.getByTestId('sheet-lanes-all').locator('tbody tr')).toHaveCount(100);
	const withLists = (await sheetPdf(page.request, `${pdfPath}?appendix=1`)).join('\n');
	expect(withLists.match(/^Lane \d+ crop (corn|soybean) (20|10) ft /gm)).toHaveLength(100);
});

import { expect, test } from '@playwright/test';
import { signIn } from './helpers';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

// 8/8 strips 5 ft right of the west edge, 40-ft headland: 63 lanes on the 1,320-ft test field
// (counted by hand in plans.spec.ts).
const EIGHT_EIGHT = { pattern: [CORN_8, SOYBEAN_8], offsetFt: 5, headlandFt: 40 };
const seed = (laneIndex: number, variety: string, populationPerAcre: number) => ({ laneIndex, variety, relativeMaturity: null, populationPerAcre, seedLot: null, trialLabel: null, notes: null });

test('the plan page lists every lane with numbers right-aligned; the text editor keeps one line per assignment and saves without JavaScript', async ({ browser }) => {
	const setup = await (await browser.newContext()).newPage();
	const own = await ownFarm(setup, 'reads');
	const { boundary, guidance } = eightyAcres(-94.37, 43.75);
	const fieldId = await ownField(setup.request, own.farmId, 'Text field', boundary);
	const api = `/api/farms/${own.farmId}/fields/${fieldId}/plans/2027`;
	const created = await ownPlan(setup.request, own.farmId, fieldId, 2027, { guidance, ...EIGHT_EIGHT });
	expect(created.lanes).toHaveLength(63);
	const assigned = await setup.request.put(api, { data: { guidance, ...EIGHT_EIGHT, version: 1, assignments: [seed(0, 'hybrid T (104-day)', 34_000), seed(1, 'soybean line T', 140_000)] } });
	expect(assigned.status(), await assigned.text()).toBe(200);

	// lanes.geojson over real HTTP: the tag it gives back answers 304.
	const geo = await setup.request.get(`${api}/lanes.geojson`);
	expect(geo.status()).toBe(200);
	const tag = geo.headers()['etag'];
	expect(tag).toMatch(/^W\/"lanes1-/);
	expect((await setup.request.get(`${api}/lanes.geojson`, { headers: { 'if-none-match': tag } })).status()).toBe(304);

	await setup.goto(`/farms/${own.farmId}/fields/${fieldId}/plans/2027`);
	const rows = setup.getByTestId('lane-table').locator('tbody tr');
	await expect(rows).toHaveCount(63);
	await expect(rows.nth(0)).toContainText('hybrid T (104-day) · 34,000 seeds/ac');
	const acresCell = rows.nth(62).locator('td').nth(5);
	await expect(acresCell).toHaveText(/^\d+\.\d{3} ac$/);
	await expect(acresCell).toHaveCSS('text-align', 'right');
	await expect(rows.nth(62).locator('td').nth(1)).toHaveCSS('text-align', 'left');
	await setup.context().close();

	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await signIn(page, own.email, own.password);
	await page.goto(`/farms/${own.farmId}/fields/${fieldId}/plans/2027`);
	await expect(page.getByTestId('lane-table').locator('tbody tr')).toHaveCount(63);
	await page.getByText('Edit as text (works without JavaScript)').click();
	const editor = page.getByLabel('Plan settings (JSON)');
	const text = await editor.inputValue();
	expect(text.split('\n').filter((l) => l.includes('"laneIndex"'))).toEqual([
		'  {"laneIndex":0,"variety":"hybrid T (104-day)","populationPerAcre":34000},',
		'  {"laneIndex":1,"variety":"soybean line T","populationPerAcre":140000}'
	]);
	expect(text).not.toContain('null');
	const settings = JSON.parse(text);
	expect(settings).toMatchObject({ version: 2, variant: 'main', offsetFt: 5, headlandFt: 40 });
	await editor.fill(JSON.stringify({ ...settings, offsetFt: 25 }, null, 1));
	await page.getByRole('button', { name: 'Save as text' }).click();
	await expect(page.getByTestId('lane-table').locator('tbody tr')).toHaveCount(63);

	const saved = await (await page.request.get(api)).json();
	expect(saved).toMatchObject({ version: 3, offsetFt: 25 });
	expect(saved.assignments).toEqual([seed(0, 'hybrid T (104-day)', 34_000), seed(1, 'soybean line T', 140_000)]);
	await context.close();
});

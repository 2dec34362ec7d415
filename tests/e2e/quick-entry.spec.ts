import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

const SEASON = new Date().getUTCFullYear();

test.use({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });

test('on a phone: log a side-dress pass of UAN on all corn lanes in a few taps', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'quick');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Quick 80', boundary);
	const plan = await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	const res = await page.request.post(`/api/farms/${farmId}/products`, { data: { name: 'UAN 32 %', kind: 'fertilizer', unit: 'gal' } });
	expect(res.status(), await res.text()).toBe(201);
	const corn: { index: number; acres: number }[] = plan.lanes.filter((l: { crop: string }) => l.crop === 'corn');
	const acres = corn.reduce((s, l) => s + l.acres, 0);

	await page.goto(`/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/quick`);
	await expect(page.getByRole('heading', { level: 1, name: 'Quick entry' })).toBeVisible();
	await page.getByLabel('Side-dress').check();
	await page.getByLabel(/All corn lanes/).check();
	await page.getByLabel('Product').selectOption({ label: 'UAN 32 %' });
	await page.getByLabel('Rate').fill('15');
	await expect(page.getByLabel('Unit')).toHaveValue('gal/ac');
	const save = page.getByRole('button', { name: 'Save pass' });
	expect((await save.boundingBox())!.height).toBeGreaterThanOrEqual(44);
	// Nothing runs off the side of a phone screen.
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	await save.tap();

	const saved = page.getByTestId('quick-saved');
	await expect(saved).toContainText(`Fertilizer on lanes`);
	await expect(saved).toContainText(`${acres.toLocaleString('en-US', { maximumFractionDigits: 2 })} ac; UAN 32 % ${(15 * Math.round(acres * 1e4) / 1e4).toLocaleString('en-US', { maximumFractionDigits: 2 })} gal.`);

	const list = await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records`)).json();
	expect(list.records).toHaveLength(1);
	const r = list.records[0];
	expect(r.type).toBe('fertilizer');
	expect(r.details).toEqual({ placement: 'side-dress' });
	expect(r.laneIndexes).toEqual(corn.map((l) => l.index));
	expect(r.acres).toBeCloseTo(acres, 3);
	expect(r.products[0]).toMatchObject({ rate: 15, rateUnit: 'gal/ac', totalUnit: 'gal' });
	expect(r.products[0].total).toBeCloseTo(15 * r.acres, 3);
});

test('on a phone: no lanes are chosen for you; a pass without a choice of lanes is refused and nothing is saved', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'quick-where');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Quick where', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });

	await page.goto(`/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/quick`);
	await expect(page.getByLabel(/All corn lanes/)).not.toBeChecked();
	await expect(page.getByLabel(/All soybean lanes/)).not.toBeChecked();
	await page.getByLabel('Mowing').check();
	await page.getByRole('button', { name: 'Save pass' }).tap();
	await expect(page.getByText('Choose where: all lanes of one crop, or a list of lane numbers.')).toBeVisible();
	await expect(page.getByTestId('quick-saved')).toHaveCount(0);
	const list = await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records`)).json();
	expect(list.records).toEqual([]);
});

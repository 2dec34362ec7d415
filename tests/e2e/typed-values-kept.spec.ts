import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

const SEASON = new Date().getUTCFullYear();

test('a record form opened straight from its address keeps what was typed when lanes are picked afterwards', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'typed');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Typed 80', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });

	// A full page load (not a link inside the app): the form is drawn by the server and then taken over.
	await page.goto(`/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records/new`, { waitUntil: 'networkidle' });
	const started = page.getByLabel('Started (farm time)');
	await expect(started).not.toHaveValue('');
	const typedStart = `${SEASON}-01-02T07:15`;
	await started.fill(typedStart);
	await page.getByLabel('Ended (farm time)').fill(`${SEASON}-01-02T09:45`);
	await page.getByLabel('Applicator', { exact: true }).fill('Pat Field');
	await page.getByLabel('Temperature (°F)').fill('41');
	// Picking lanes redraws the lane summary beside the form; nothing typed may be lost to it.
	await page.getByLabel('Lane numbers').fill('1-3');
	await expect(page.locator('#lanes-hint')).toContainText('lanes 1–3');
	await page.getByRole('button', { name: 'All corn lanes' }).click();
	await expect(started).toHaveValue(typedStart);
	await expect(page.getByLabel('Ended (farm time)')).toHaveValue(`${SEASON}-01-02T09:45`);
	await expect(page.getByLabel('Applicator', { exact: true })).toHaveValue('Pat Field');
	await expect(page.getByLabel('Temperature (°F)')).toHaveValue('41');
});

test.describe('the page never runs off the side', () => {
	test('at 1366 px the farm menu wraps inside the window', async ({ page }) => {
		await page.setViewportSize({ width: 1366, height: 900 });
		const { farmId } = await ownFarm(page, 'menu');
		await page.goto(`/farms/${farmId}/records`);
		const menu = page.getByRole('navigation', { name: 'Main' }).last();
		await expect(menu.getByRole('link', { name: 'Seed catalogue' })).toBeVisible();
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1366);
		const signOut = await page.getByRole('button', { name: 'Sign out' }).boundingBox();
		expect(signOut!.x + signOut!.width).toBeLessThanOrEqual(1366);
	});

	test('on a phone a wide table scrolls in its own box, its hidden column labels included', async ({ page }) => {
		await page.setViewportSize({ width: 390, height: 844 });
		const { farmId } = await ownFarm(page, 'phone-table');
		await page.goto(`/farms/${farmId}/team`);
		const table = page.getByRole('table').first();
		await expect(table).toBeVisible();
		// The members table is wider than the phone, so the box scrolls and the page does not.
		expect((await table.boundingBox())!.width).toBeGreaterThan(390);
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	});
});

test('a printed season page carries the lane map without its zoom buttons', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'print-map');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Print 80', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	await page.goto(`/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}`);
	const zoom = page.locator('.leaflet-control-zoom').first();
	await expect(zoom).toBeVisible();
	await page.emulateMedia({ media: 'print' });
	await expect(page.locator('.leaflet-container').first()).toBeVisible();
	await expect(zoom).toBeHidden();
});

test('a row header cell is ruled like the rest of its row', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'rules');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Ruled 80', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	await page.goto(`/farms/${farmId}/records`);
	const row = page.getByTestId('record-book-grid').locator('tbody tr').first();
	const rule = (cell: 'th' | 'td') => row.locator(cell).first().evaluate((el) => { const s = getComputedStyle(el); return `${s.borderBottomWidth} ${s.borderBottomColor}`; });
	expect(await rule('th')).toBe(await rule('td'));
});

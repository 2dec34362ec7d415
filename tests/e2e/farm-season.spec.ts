import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

// Two 80-acre fields side by side, 200 ft apart: West has plans for 2025 and 2026, East only 2026.
const WEST = eightyAcres(-94.31, 43.71);
const EAST = eightyAcres(-94.31 + (1520 * 0.3048) / (111_320 * Math.cos((43.71 * Math.PI) / 180)), 43.71);
const STRIPS = { pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 };

test('the season map steps through seasons in place with buttons, arrow keys and the address', async ({ page }) => {
	test.setTimeout(180_000);
	const { farmId } = await ownFarm(page, 'season-map');
	const west = await ownField(page.request, farmId, 'West 80', WEST.boundary);
	const east = await ownField(page.request, farmId, 'East 80', EAST.boundary);
	const w2025 = await ownPlan(page.request, farmId, west, 2025, { guidance: WEST.guidance, ...STRIPS });
	const w2026 = await ownPlan(page.request, farmId, west, 2026, { guidance: WEST.guidance, ...STRIPS, offsetFt: 20 });
	const e2026 = await ownPlan(page.request, farmId, east, 2026, { guidance: EAST.guidance, ...STRIPS });

	await page.goto(`/farms/${farmId}?season=2026`);
	const shown = page.getByTestId('season-shown');
	const map = page.getByTestId('season-map');
	const rows = page.getByTestId('field-row');
	await expect(shown).toHaveText('Season 2026');
	await expect(map).toHaveAttribute('data-draw-count', String(w2026.lanes.length + e2026.lanes.length));
	await expect(rows).toHaveCount(2);
	await expect(rows.filter({ hasText: 'East 80' })).not.toContainText('no plan');
	await expect(page.getByTestId('fields-planned')).toHaveText('2 of 2');
	// Survives only if the page is never reloaded.
	await page.evaluate(() => ((window as unknown as { stayed: string }).stayed = 'same page'));

	await page.getByRole('link', { name: 'Previous season (2025)' }).click();
	await expect(shown).toHaveText('Season 2025');
	await expect(page).toHaveURL(new RegExp(`/farms/${farmId}\\?season=2025$`));
	await expect(map).toHaveAttribute('data-draw-count', String(w2025.lanes.length));
	await expect(rows.filter({ hasText: 'East 80' }).getByText('no plan', { exact: true })).toBeVisible();
	await expect(rows.filter({ hasText: 'West 80' }).getByText('no plan', { exact: true })).toHaveCount(0);
	await expect(page.getByTestId('fields-planned')).toHaveText('1 of 2');

	await page.locator('body').click({ position: { x: 5, y: 5 } });
	await page.keyboard.press('ArrowRight');
	await expect(shown).toHaveText('Season 2026');
	await expect(page).toHaveURL(new RegExp(`\\?season=2026$`));
	await page.keyboard.press('ArrowRight');
	await expect(shown).toHaveText('Season 2027');
	await expect(map).toHaveAttribute('data-draw-count', '0');
	await expect(page.getByTestId('fields-planned')).toHaveText('0 of 2');
	await expect(page.getByText('No field has a plan for 2027.')).toBeVisible();
	await page.keyboard.press('ArrowLeft');
	await page.keyboard.press('ArrowLeft');
	await expect(shown).toHaveText('Season 2025');
	await page.getByRole('link', { name: 'Next season (2026)' }).click();
	await expect(shown).toHaveText('Season 2026');
	expect(await page.evaluate(() => (window as unknown as { stayed?: string }).stayed)).toBe('same page');

	// Totals for 2026 with the change from 2025 and the rotation of the field planned both years.
	const crops = page.getByRole('table', { name: 'Acres by crop in 2026' });
	await expect(crops.getByRole('row', { name: /^corn / })).toBeVisible();
	await expect(page.getByRole('table', { name: 'Rotation across the farm, 2025 to 2026' })).toBeVisible();

	// A lane of the west field (left of the map's middle): its field, number, crop and records.
	const box = (await map.boundingBox())!;
	await map.click({ position: { x: box.width / 2 - 100, y: box.height / 2 } });
	const panel = page.getByTestId('lane-panel');
	await expect(panel.getByRole('heading', { level: 2 })).toHaveText(/^West 80, lane \d+$/);
	await expect(panel).toContainText(/Crop(corn|soybean) \(crop lane\)/);
	await expect(panel.getByText('Nothing logged on this lane in 2026.')).toBeVisible();
	await expect(panel.getByRole('link', { name: 'Open the 2026 plan' })).toHaveAttribute('href', `/farms/${farmId}/fields/${west}/plans/2026`);

	// A linked season opens on that season; a season far from any plan is empty, not an error.
	await page.goto(`/farms/${farmId}?season=1900`);
	await expect(shown).toHaveText('Season 1900');
	await expect(rows.getByText('no plan', { exact: true })).toHaveCount(2);
	await page.goto(`/farms/${farmId}?season=banana`);
	await expect(page.getByText('"banana" is not a season this farm can plan (a year from 1900 to 2200); showing 2026.')).toBeVisible();
	await expect(shown).toHaveText('Season 2026');
});

test('a farm with no fields shows an empty state on the season map', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'empty-map');
	await page.goto(`/farms/${farmId}`);
	await expect(page.getByRole('heading', { level: 2, name: 'No fields yet' })).toBeVisible();
	await expect(page.getByText('No fields to total yet.')).toBeVisible();
	await expect(page.getByRole('link', { name: 'Winter planning board' })).toBeVisible();
});

test.describe('at phone width', () => {
	test.use({ viewport: { width: 375, height: 812 } });
	test('field labels stay inside the map, long names included', async ({ page }) => {
		const { farmId } = await ownFarm(page, 'phone-labels');
		await ownField(page.request, farmId, 'West field along the creek bottom', WEST.boundary);
		await ownField(page.request, farmId, 'East field by the county road', EAST.boundary);
		await page.goto(`/farms/${farmId}`);
		const map = page.getByTestId('season-map');
		const labels = page.locator('.farm-field-label');
		await expect(labels).toHaveCount(2);
		const box = (await map.boundingBox())!;
		for (const label of await labels.all()) {
			await expect(label).toBeVisible();
			const b = (await label.boundingBox())!;
			expect(b.x, await label.innerText()).toBeGreaterThanOrEqual(box.x);
			expect(b.x + b.width, await label.innerText()).toBeLessThanOrEqual(box.x + box.width);
		}
	});

	test('the season map, planning board and needs pages have no serious accessibility problems and 44-px steps', async ({ page }) => {
		test.setTimeout(180_000);
		const { farmId } = await ownFarm(page, 'phone-map');
		const west = await ownField(page.request, farmId, 'Phone 80', WEST.boundary);
		await ownPlan(page.request, farmId, west, 2026, { guidance: WEST.guidance, ...STRIPS });
		for (const path of [`/farms/${farmId}?season=2026`, `/farms/${farmId}/planning?season=2027`, `/farms/${farmId}/needs?season=2026`]) {
			const res = await page.goto(path);
			expect(res?.status()).toBe(200);
			await page.waitForLoadState('networkidle');
			const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).exclude('.leaflet-pane').analyze();
			expect(result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes[0]?.target.join(' ')}`), path).toEqual([]);
		}
		await page.goto(`/farms/${farmId}?season=2026`);
		for (const name of ['Previous season (2025)', 'Next season (2027)']) {
			expect((await page.getByRole('link', { name }).boundingBox())!.height).toBeGreaterThanOrEqual(44);
		}
	});
});

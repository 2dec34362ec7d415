import { expect, test } from '@playwright/test';
import { ownFarm, ownField, ownPlan, CORN_8, SOYBEAN_8 } from './own-farm';
import { rectangle } from '../fixtures/rectangle';
import { generateYieldFile } from '../fixtures/yield-file';

const LNG = -94.27;
const LAT = 43.83;

async function stripField(page: import('@playwright/test').Page) {
	const farm = await ownFarm(page, 'harvest');
	const boundary = rectangle(159, 1000, LNG, LAT);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const fieldId = await ownField(page.request, farm.farmId, 'Scale strips', boundary);
	const plan = await ownPlan(page.request, farm.farmId, fieldId, 2026, { guidance: { a: sw, b: nw }, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	return { farm, fieldId, plan, url: `/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/harvest` };
}

test.describe('harvest', () => {
	test('two weigh-wagon loads, outside and inside rows of lane 3, give bushels per acre and the edge-effect chart', async ({ page }) => {
		const { plan, url, farm, fieldId } = await stripField(page);
		const lane = plan.lanes[2];
		expect(lane).toMatchObject({ index: 2, crop: 'corn', rows: 8, borderRows: 2 });
		await page.goto(url);
		await expect(page.getByRole('heading', { level: 1, name: 'Harvest 2026 · Scale strips' })).toBeVisible();

		const log = async (rows: 'Outside rows' | 'Inside rows', lb: string) => {
			await page.getByLabel('Lanes').fill('3');
			await page.getByLabel('Crop', { exact: true }).selectOption('corn');
			await page.getByLabel('Rows harvested').selectOption({ label: rows });
			await page.getByLabel('Wet weight (lb)').fill(lb);
			await page.getByLabel('Moisture (%)').fill('18');
			await page.getByRole('button', { name: 'Save load' }).click();
			await expect(page.getByText('Load saved.')).toBeVisible();
		};
		await log('Outside rows', '1300');
		await log('Inside rows', '3600');

		// Corn at 18 % to 15.5 %: lb × 82 ÷ 84.5 ÷ 56 lb/bu (Rankin, UW-Extension; Mulvaney & Devkota, UF/IFAS 2020),
		// over the 2 outside rows' and the 6 inside rows' share of the lane's acres.
		const perAcre = (lb: number, share: number) => ((lb * 82) / 84.5 / 56 / (lane.acres * share)).toFixed(2);
		const rows = page.getByTestId('harvest-entry');
		await expect(rows).toHaveCount(2);
		await expect(rows.nth(0).getByTestId('entry-yield')).toHaveText(`${perAcre(1300, 2 / 8)} bu/ac`);
		await expect(rows.nth(1).getByTestId('entry-yield')).toHaveText(`${perAcre(3600, 6 / 8)} bu/ac`);
		await expect(rows.nth(0).getByRole('rowheader')).toHaveText('3');

		await expect(page.getByTestId('edge-chart').locator('canvas')).toBeVisible();
		const edge = page.getByTestId('edge-table').locator('tbody tr');
		await expect(edge).toHaveCount(1);
		await expect(edge.getByRole('rowheader')).toHaveText('corn');
		await expect(edge.locator('td').nth(0)).toHaveText(`${Number(perAcre(1300, 2 / 8)).toFixed(1)} bu/ac`);
		await expect(edge.locator('td').nth(1)).toHaveText(`${Number(perAcre(3600, 6 / 8)).toFixed(1)} bu/ac`);
		await expect(page.getByText('Only 1 replication: no confidence interval can be estimated; treat the difference as anecdote.')).toBeVisible();

		// Bad input stays on the form with the reason next to it.
		await page.getByLabel('Lanes').fill('3');
		await page.getByLabel('Wet weight (lb)').fill('1000');
		await page.getByLabel('Moisture (%)').fill('45');
		await page.getByRole('button', { name: 'Save load' }).click();
		await expect(page.locator('#f-moisturePct-error')).toHaveText('Moisture must be between 5 % and 40 %; 45 % is outside it.');
		await expect(rows).toHaveCount(2);

		const csv = await page.request.get(`/api/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/harvest.csv`);
		expect(csv.status()).toBe(200);
		expect((await csv.text()).trim().split('\r\n')).toHaveLength(3);
	});

	test('a small yield-monitor file: name its columns, watch it progress to done, read the per-lane table', async ({ page }) => {
		test.setTimeout(120_000);
		const { url } = await stripField(page);
		const file = generateYieldFile({ lng: LNG, lat: LAT, lanes: 8, laneWidthFt: 20, lengthFt: 1000, yieldOf: (i) => (i % 2 === 0 ? 210 : 62), mishaps: true });
		await page.goto(`${url}/import`);
		await page.getByLabel('Yield file (CSV)').setInputFiles({ name: 'monitor.csv', mimeType: 'text/csv', buffer: Buffer.from(file.csv) });
		await page.getByLabel('Source').fill('Test display');
		await page.getByRole('button', { name: 'Upload and read' }).click();

		const imp = page.getByTestId('yield-import');
		await expect(imp.getByRole('heading', { name: 'monitor.csv · Test display' })).toBeVisible();
		await expect(imp.getByLabel('Longitude (°)')).toHaveValue('Longitude');
		await expect(imp.getByLabel('Yield (bu/ac)')).toHaveValue('Yld Vol(Dry)(bu/ac)');
		await expect(imp.getByLabel('Moisture (%)')).toHaveValue('Moisture(%)');
		await imp.getByRole('button', { name: 'Save columns and read the file' }).click();

		await expect(page.getByTestId('import-progress').or(page.getByTestId('import-done'))).toBeVisible();
		await expect(page.getByTestId('import-done')).toBeVisible({ timeout: 90_000 });
		const kept = file.expected.total - file.expected.ramp - file.expected.stopped - file.expected.overlap - file.expected.outside;
		await expect(page.getByTestId('import-done')).toHaveText(`Done: ${kept.toLocaleString('en-US')} of ${file.expected.total.toLocaleString('en-US')} points kept; 30 outside the grain lanes.`);
		const lanes = page.getByTestId('import-lanes').locator('tbody tr');
		await expect(lanes).toHaveCount(8);
		await expect(lanes.nth(0).getByRole('rowheader')).toHaveText('Lane 1');
		await expect(lanes.nth(0).locator('td').nth(2)).toHaveText('210.0 bu/ac');
		await expect(lanes.nth(1).locator('td').nth(2)).toHaveText('62.0 bu/ac');

		// The harvest page takes the monitor's means where nothing was weighed.
		await page.goto(url);
		await expect(page.getByTestId('lane-yields').locator('tbody tr')).toHaveCount(8);
		await expect(page.getByTestId('lane-yields').locator('tbody tr').nth(0).locator('td').nth(3)).toHaveText('210.0 bu/ac');
	});
});

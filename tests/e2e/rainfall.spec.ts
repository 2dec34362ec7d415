import { expect, test } from '@playwright/test';
import { ownFarm, ownField } from './own-farm';
import { rectangle } from '../fixtures/rectangle';

function dayBefore(date: string): string {
	const d = new Date(`${date}T12:00:00Z`);
	d.setUTCDate(d.getUTCDate() - 1);
	return d.toISOString().slice(0, 10);
}

test('the owner places a rain gauge, records two days of rain, sees the season total and the weekly chart; a second reading of a day is refused', async ({ page }) => {
	const farm = await ownFarm(page, 'rain-owner');
	await ownField(page.request, farm.farmId, 'Rain field', rectangle(600, 600, -94.45, 43.62));
	await page.goto(`/farms/${farm.farmId}/rainfall`);
	await expect(page.getByText('No rain gauges yet. Add one with the form.')).toBeVisible();

	await page.getByLabel('Name', { exact: true }).fill('South gauge');
	await page.getByLabel('Longitude').fill('-94.449');
	await page.getByLabel('Latitude').fill('43.6205');
	await page.getByLabel('Field (optional)').selectOption({ label: 'Rain field' });
	await page.getByRole('button', { name: 'Add gauge' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Rain gauge added.' })).toBeVisible();
	await expect(page.getByTestId('rain-map').locator('.rain-gauge-mark')).toHaveCount(1);

	const today = await page.getByLabel('Day', { exact: true }).inputValue();
	expect(today).toMatch(/^\d{4}-\d{2}-\d{2}$/);
	await page.getByLabel('Rain (in)', { exact: true }).fill('0.45');
	await page.getByRole('button', { name: 'Save reading' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Reading saved.' })).toBeVisible();
	await page.getByLabel('Day', { exact: true }).fill(dayBefore(today));
	await page.getByLabel('Rain (in)', { exact: true }).fill('1.3');
	await page.getByRole('button', { name: 'Save reading' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Reading saved.' })).toBeVisible();

	// The season is the calendar year of the readings; yesterday may fall in last year on 1 January.
	if (dayBefore(today).slice(0, 4) === today.slice(0, 4)) {
		const totals = page.getByTestId('rain-totals');
		await expect(totals.getByRole('row', { name: /South gauge/ }).getByRole('cell').nth(1)).toHaveText('1.75 in');
		await expect(totals.getByRole('row', { name: /South gauge/ }).getByRole('cell').nth(2)).toHaveText('2');
		await expect(page.getByRole('img', { name: 'Weekly rain per gauge in inches; the same figures are in the table below' }).locator('canvas')).toBeVisible();
		await page.getByText('Weekly figures as a table').click();
		const weeks = page.getByTestId('rain-weeks').locator('tbody tr');
		const sums = await weeks.locator('td').allTextContents();
		expect(sums.map((t) => Number(t.replace(' in', ''))).reduce((a, b) => a + b, 0)).toBeCloseTo(1.75, 6);
	}
	const daily = page.getByTestId('rain-readings');
	await expect(daily.getByRole('row').filter({ hasText: today })).toContainText('0.45 in');

	// A second reading for the same gauge and day: refused beside the form, the first one kept.
	await page.getByLabel('Day', { exact: true }).fill(today);
	await page.getByLabel('Rain (in)', { exact: true }).fill('0.5');
	await page.getByRole('button', { name: 'Save reading' }).click();
	await expect(page.getByRole('alert').filter({ hasText: `South gauge already has 0.45 in for ${today}; edit that reading instead.` })).toBeVisible();
	await page.goto(`/farms/${farm.farmId}/rainfall`);
	await expect(page.getByTestId('rain-readings').getByRole('row').filter({ hasText: today })).toContainText('0.45 in');

	// Corrected in place.
	const row = page.getByTestId('rain-readings').getByRole('row').filter({ hasText: today });
	await row.getByText('Correct').click();
	await row.getByLabel(`Rain on ${today} at South gauge (in)`).fill('0.55');
	await row.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Reading corrected.' })).toBeVisible();
	await expect(page.getByTestId('rain-readings').getByRole('row').filter({ hasText: today })).toContainText('0.55 in');
});

test('rainfall reads on a phone: the form fits 375 px and its inputs are at least 44 px tall', async ({ browser }) => {
	const context = await browser.newContext({ viewport: { width: 375, height: 812 } });
	const page = await context.newPage();
	const farm = await ownFarm(page, 'rain-phone');
	const gauge = await page.request.post(`/api/farms/${farm.farmId}/rainfall/gauges`, { data: { name: 'Phone gauge', location: { lng: -94.5, lat: 43.6 } } });
	expect(gauge.status()).toBe(201);
	await page.goto(`/farms/${farm.farmId}/rainfall`);
	const inches = page.getByLabel('Rain (in)', { exact: true });
	await expect(inches).toBeVisible();
	expect((await inches.boundingBox())!.height).toBeGreaterThanOrEqual(44);
	expect((await page.getByRole('button', { name: 'Save reading' }).boundingBox())!.height).toBeGreaterThanOrEqual(44);
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
	await context.close();
});

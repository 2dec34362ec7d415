// The owner switches the farm to metric and to another time zone on the settings page; the fields
// page then shows hectares, and the farm menu reaches products, the seed catalogue and rainfall.
import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

test('switching to metric shows the fields page in hectares; the time zone is saved from its list', async ({ page }) => {
	const farm = await ownFarm(page, 'settings');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farm.farmId, 'Settings north', boundary);
	const plan = await ownPlan(page.request, farm.farmId, fieldId, 2026, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });

	await page.goto(`/farms/${farm.farmId}/fields`);
	const total = page.getByTestId('total-acres');
	await expect(total).toHaveText(/^\d+\.\d\d ac$/);
	const acres = parseFloat((await total.textContent())!);
	// 1,320 × 2,640 ft is 80 ac on the plane; the ellipsoid and the fixture's rounding move it a little.
	expect(acres).toBeGreaterThan(79.5);
	expect(acres).toBeLessThan(80.5);

	await page.goto(`/farms/${farm.farmId}/settings`);
	const units = page.getByRole('group', { name: 'Show numbers in' });
	await expect(units.getByLabel('US customary (acres, feet)')).toBeChecked();
	await units.getByLabel('Metric (hectares, metres)').check();
	await page.getByRole('button', { name: 'Save units' }).click();
	await expect(page.getByRole('status')).toHaveText('Areas now show in hectares and lengths in metres.');

	const zone = page.getByLabel('Farm time zone');
	await expect(zone).toHaveValue('America/Chicago');
	await zone.selectOption('Europe/Berlin');
	await page.getByRole('button', { name: 'Save time zone' }).click();
	await expect(page.getByText('Days and times now read in Europe/Berlin.', { exact: true })).toBeVisible();
	await expect(page.getByText(/^Saved: Europe\/Berlin, now /)).toBeVisible();

	// Another page load reads the saved settings from the server.
	await page.goto(`/farms/${farm.farmId}/fields`);
	const table = page.getByTestId('fields-table');
	await expect(table.getByRole('columnheader', { name: /^Hectares/ })).toBeVisible();
	await expect(total).toHaveText(/^\d+\.\d\d ha$/);
	const hectares = parseFloat((await total.textContent())!);
	// 1 ac = 0.4046856 ha (NIST Handbook 44, 2023, Appendix C); both figures are rounded to 0.01.
	expect(Math.abs(hectares - acres * 0.4046856)).toBeLessThan(0.011);
	await expect(table.getByRole('row', { name: /Settings north/ }).getByRole('cell').nth(1)).toHaveText(`${hectares.toFixed(2)} ha`);

	// The season map's totals, legend and field labels read in hectares too.
	await page.goto(`/farms/${farm.farmId}?season=2026`);
	const planted = Number(plan.plantedAcres);
	await expect(page.getByTestId('total-planted')).toHaveText(`${(planted * 0.4046856).toFixed(1)} ha`);
	await expect(page.getByRole('table', { name: 'Hectares by crop in 2026' })).toBeVisible();
	await expect(page.getByRole('list', { name: 'Crop colours' }).getByRole('listitem').first()).toHaveText(/^corn\s·\s\d+\.\d ha$/);

	await page.goto(`/farms/${farm.farmId}/settings`);
	await expect(page.getByLabel('Metric (hectares, metres)')).toBeChecked();
	await expect(page.getByLabel('Farm time zone')).toHaveValue('Europe/Berlin');

	// The farm menu reaches the product list, the seed catalogue and the rain gauges.
	const menu = page.getByRole('navigation', { name: 'Main' }).last();
	await menu.getByRole('link', { name: 'Products', exact: true }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${farm.farmId}/products$`));
	await menu.getByRole('link', { name: 'Seed catalogue', exact: true }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${farm.farmId}/seeds$`));
	await menu.getByRole('link', { name: 'Rainfall', exact: true }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${farm.farmId}/rainfall$`));
});

test('an unknown zone posted without the list is answered beside the select, and nothing changes', async ({ page }) => {
	const farm = await ownFarm(page, 'settings-zone');
	await page.goto(`/farms/${farm.farmId}/settings`);
	// A hand-made post, as from a stale or altered page: the server checks the zone itself.
	await page.getByLabel('Farm time zone').evaluate((select: HTMLSelectElement) => {
		const option = document.createElement('option');
		option.value = 'Mars/Olympus_Mons';
		option.textContent = 'Mars';
		select.append(option);
		select.value = 'Mars/Olympus_Mons';
		select.dispatchEvent(new Event('change', { bubbles: true }));
	});
	await page.getByRole('button', { name: 'Save time zone' }).click();
	await expect(page.locator('#f-timeZone-error')).toHaveText('"Mars/Olympus_Mons" is not a time zone this server knows. Choose one from the list, e.g. America/Chicago.');
	await expect(page.getByLabel('Farm time zone')).toHaveAttribute('aria-invalid', 'true');
	await page.reload();
	await expect(page.getByText('Saved: America/Chicago', { exact: false })).toBeVisible();
});

test('without JavaScript both forms save and answer on the page', async ({ page, browser }) => {
	const farm = await ownFarm(page, 'settings-nojs');
	const settings = new URL(`/farms/${farm.farmId}/settings`, page.url()).href;
	const context = await browser.newContext({ javaScriptEnabled: false, storageState: await page.context().storageState() });
	const plain = await context.newPage();
	await plain.goto(settings);
	await plain.getByLabel('Metric (hectares, metres)').check();
	await plain.getByRole('button', { name: 'Save units' }).click();
	await expect(plain.getByText('Areas now show in hectares and lengths in metres.', { exact: true })).toBeVisible();
	await plain.getByLabel('Farm time zone').selectOption('Asia/Tokyo');
	await plain.getByRole('button', { name: 'Save time zone' }).click();
	await expect(plain.getByText('Days and times now read in Asia/Tokyo.', { exact: true })).toBeVisible();
	await plain.goto(settings);
	await expect(plain.getByLabel('Metric (hectares, metres)')).toBeChecked();
	await expect(plain.getByLabel('Farm time zone')).toHaveValue('Asia/Tokyo');
	await context.close();
});

import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { CORN_8, SOYBEAN_8, eightyAcres, joinOwnFarm, ownFarm, ownField, ownPlan } from './own-farm';

test('the owner adds a product and a variety through the pages; the form says what is wrong beside the input', async ({ page }) => {
	const own = await ownFarm(page, 'catalog');

	await page.goto(`/farms/${own.farmId}/products`);
	await page.getByRole('link', { name: 'Add product' }).click();
	await page.getByLabel('Name', { exact: true }).fill('residual herbicide T');
	await page.getByLabel('Kind').selectOption('herbicide');
	await page.getByLabel('Unit it is measured in').selectOption('pt');
	await expect(page.getByTestId('label-caution')).toContainText('The label is the law.');
	await page.getByLabel('EPA registration number').fill('12-AB');
	await page.getByLabel('Restricted-use pesticide').check();
	await page.getByLabel('Restricted-entry interval (h)').fill('24');
	await page.getByLabel('Pre-harvest interval (days)').fill('60');
	await page.getByLabel('Grazing/feeding interval (days)').fill('-30');
	await page.getByRole('button', { name: 'Save product' }).click();
	await expect(page.locator('#f-epaRegNo-error')).toHaveText('An EPA registration number looks like 1234-56 or 1234-56-7890 (company, product, distributor).');
	await expect(page.locator('#f-grazingDays-error')).toHaveText('An interval cannot be negative.');
	await expect(page.getByLabel('Name', { exact: true })).toHaveValue('residual herbicide T');

	await page.getByLabel('EPA registration number').fill('1234-56');
	await page.getByLabel('Grazing/feeding interval (days)').fill('30');
	await page.getByRole('button', { name: 'Save product' }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${own.farmId}/products\\?saved=`));
	await expect(page.getByText('Saved residual herbicide T.', { exact: true })).toBeVisible();
	const item = page.getByTestId('product-item');
	await expect(item).toHaveCount(1);
	await expect(item.getByTestId('product-name')).toHaveText('residual herbicide T');
	await expect(item.getByText('Restricted use', { exact: true })).toBeVisible();
	await expect(item.getByText('24 h', { exact: true })).toBeVisible();
	await expect(item.getByText('60 days', { exact: true })).toBeVisible();
	await expect(item.getByTestId('label-caution')).toContainText('The label is the law.');
	await expect(item.getByTestId('label-caution')).toContainText('not a recommendation');

	const products = await (await page.request.get(`/api/farms/${own.farmId}/products`)).json();
	expect(products.map((p: { name: string; epaRegNo: string; restrictedUse: boolean; reiHours: number; phiDays: number; grazingDays: number }) => [p.name, p.epaRegNo, p.restrictedUse, p.reiHours, p.phiDays, p.grazingDays])).toEqual([
		['residual herbicide T', '1234-56', true, 24, 60, 30]
	]);

	await page.goto(`/farms/${own.farmId}/seeds`);
	await page.getByLabel('Crop', { exact: true }).fill('soybean');
	await page.getByLabel('Variety or hybrid').fill('line T');
	await page.getByLabel('Relative maturity (days or group)').fill('2.1');
	await page.getByLabel('Seeds per unit').fill('140,000');
	await page.getByRole('button', { name: 'Add variety' }).click();
	await expect(page.getByText('Saved soybean — line T.', { exact: true })).toBeVisible();
	const variety = page.getByTestId('variety-item');
	await expect(variety).toHaveCount(1);
	await expect(variety).toContainText('Relative maturity group 2.1 · 140,000 seeds/unit');

	await variety.getByRole('link', { name: 'line T' }).click();
	await page.getByLabel('Lot number').fill('LT-01');
	await page.getByLabel('Germination (%)').fill('93');
	await page.getByLabel('Seed treatment').fill('untreated');
	await page.getByRole('button', { name: 'Add lot' }).click();
	await expect(page.getByText('Added lot LT-01.')).toBeVisible();
	const lot = page.getByTestId('lot-table').locator('tbody tr');
	await expect(lot).toHaveCount(1);
	await expect(lot.locator('td').nth(0)).toHaveText('LT-01');
	await expect(lot.locator('td').nth(1)).toHaveText('93 %');
	await expect(lot.locator('td').nth(2)).toHaveText('untreated');
});

test('crew, advisor and viewer are refused catalogue writes with 403; another farm\'s product and variety answer 404', async ({ browser }) => {
	const ownerPage = await (await browser.newContext()).newPage();
	const own = await ownFarm(ownerPage, 'catalog-roles');
	const created = await ownerPage.request.post(`/api/farms/${own.farmId}/products`, { data: { name: 'fungicide T', kind: 'fungicide', unit: 'fl oz', reiHours: 12 } });
	expect(created.status(), await created.text()).toBe(201);
	const product = await created.json();
	const variety = await (await ownerPage.request.post(`/api/farms/${own.farmId}/varieties`, { data: { crop: 'corn', name: 'hybrid T' } })).json();

	for (const role of ['crew', 'advisor', 'viewer'] as const) {
		const { page } = await joinOwnFarm(browser, ownerPage, own, role);
		const writes = [
			await page.request.post(`/api/farms/${own.farmId}/products`, { data: { name: `by ${role}`, kind: 'other', unit: 'lb' } }),
			await page.request.patch(`/api/farms/${own.farmId}/products/${product.id}`, { data: { reiHours: 1, version: 1 } }),
			await page.request.delete(`/api/farms/${own.farmId}/products/${product.id}`),
			await page.request.post(`/api/farms/${own.farmId}/varieties`, { data: { crop: 'corn', name: `by ${role}` } }),
			await page.request.post(`/api/farms/${own.farmId}/varieties/${variety.id}/lots`, { data: { lotNumber: role } })
		];
		for (const res of writes) {
			expect(res.status(), `${role} ${res.url()}`).toBe(403);
			expect((await res.json()).error.code).toBe('forbidden');
		}
		// Reading is every member's.
		const read = await page.request.get(`/api/farms/${own.farmId}/products/${product.id}`);
		expect(read.status()).toBe(200);
		expect((await read.json()).reiHours).toBe(12);
		await page.context().close();
	}
	const after = await (await ownerPage.request.get(`/api/farms/${own.farmId}/products`)).json();
	expect(after.map((p: { name: string; version: number }) => [p.name, p.version])).toEqual([['fungicide T', 1]]);

	const otherPage = await (await browser.newContext()).newPage();
	const other = await ownFarm(otherPage, 'catalog-other');
	// Our product by its id, from a stranger and through the stranger's own farm: both 404, the same answer.
	const stranger = await otherPage.request.get(`/api/farms/${own.farmId}/products/${product.id}`);
	expect(stranger.status()).toBe(404);
	const viaTheirFarm = await otherPage.request.get(`/api/farms/${other.farmId}/products/${product.id}`);
	expect(viaTheirFarm.status()).toBe(404);
	expect((await viaTheirFarm.json()).error.code).toBe('not_found');
	expect((await otherPage.request.patch(`/api/farms/${other.farmId}/products/${product.id}`, { data: { name: 'taken', version: 1 } })).status()).toBe(404);
	expect((await otherPage.request.get(`/api/farms/${other.farmId}/varieties/${variety.id}`)).status()).toBe(404);
	await otherPage.goto(`/farms/${other.farmId}/products/${product.id}`);
	await expect(otherPage.getByText('No product here: it does not exist, was deleted, or is not shared with you.')).toBeVisible();
	await ownerPage.context().close();
	await otherPage.context().close();
});

test('the plan page refuses a soybean line on a corn lane with a visible message, and the seed table uses the catalogue', async ({ page }) => {
	const own = await ownFarm(page, 'catalog-plan');
	const { boundary, guidance } = eightyAcres(-94.41, 43.79);
	const fieldId = await ownField(page.request, own.farmId, 'Seed field', boundary);
	const plan = await ownPlan(page.request, own.farmId, fieldId, 2027, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 5, headlandFt: 40 });
	const firstCorn = plan.lanes.find((l: { crop: string }) => l.crop === 'corn').index;
	const firstSoy = plan.lanes.find((l: { crop: string }) => l.crop === 'soybean').index;
	for (const v of [{ crop: 'soybean', name: 'line T', relativeMaturity: 2.1, seedsPerUnit: 140_000 }, { crop: 'corn', name: 'hybrid T', relativeMaturity: 104, seedsPerUnit: 75_000 }]) {
		expect((await page.request.post(`/api/farms/${own.farmId}/varieties`, { data: v })).status()).toBe(201);
	}

	await page.goto(`/farms/${own.farmId}/fields/${fieldId}/plans/2027`);
	await page.getByLabel('Lanes (numbers like 1-4, 9 — or a crop name)').fill('corn');
	await page.getByLabel('Variety or hybrid').fill('line T');
	await page.getByLabel('Population (seeds/ac)').fill('34000');
	await page.getByRole('button', { name: 'Apply to these lanes' }).click();
	const message = `Lane ${firstCorn + 1} is a corn lane, but "line T" is a soybean variety in the seed catalogue. Choose a corn variety, or change the lane's crop.`;
	await expect(page.getByTestId('assign-error')).toHaveText(new RegExp(`^${message.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} \\(\\d+ lanes in all\\.\\)$`));
	await expect(page.getByTestId('lane-table').locator('tbody tr').nth(firstCorn).locator('td').nth(8)).toHaveText('');

	// The same refusal from the server, over HTTP, for a client that skips the page.
	const put = await page.request.put(`/api/farms/${own.farmId}/fields/${fieldId}/plans/2027`, {
		data: { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 5, headlandFt: 40, version: 1, assignments: [{ laneIndex: firstCorn, variety: 'line T', populationPerAcre: 34_000 }] }
	});
	expect(put.status()).toBe(400);
	expect((await put.json()).error.fields).toEqual({ 'assignments.0.variety': [message] });

	// Corn lanes take the corn hybrid; the seed table counts its units with its own 75,000 seeds per unit.
	await page.getByLabel('Variety or hybrid').fill('hybrid T');
	await page.getByRole('button', { name: 'Apply to these lanes' }).click();
	await expect(page.getByText(/^Set on \d+ lanes\. Save the plan to keep it\.$/)).toBeVisible();
	const needs = page.getByTestId('seed-needs').locator('tbody tr').first();
	await expect(needs.locator('td').nth(0)).toHaveText('corn');
	await expect(needs.locator('td').nth(1)).toHaveText('hybrid T');
	await expect(needs.locator('td').nth(4)).toContainText('75,000 seeds/unit, per the catalogue');
	await page.getByRole('button', { name: 'Save 2027 plan' }).click();
	await expect(page.getByText(/^Saved: version 2,/)).toBeVisible();
	const saved = await (await page.request.get(`/api/farms/${own.farmId}/fields/${fieldId}/plans/2027`)).json();
	expect(saved.lanes.find((l: { index: number }) => l.index === firstCorn).assignment.variety).toBe('hybrid T');
	expect(saved.lanes.find((l: { index: number }) => l.index === firstSoy).assignment).toBeNull();
});

test.describe('at phone width', () => {
	test.use({ viewport: { width: 375, height: 812 } });

	test('the product list, a product, the seed catalogue and a variety fit the screen, have no serious accessibility problems, and buttons are thumb-sized', async ({ page }) => {
		const own = await ownFarm(page, 'catalog-phone');
		const product = await (await page.request.post(`/api/farms/${own.farmId}/products`, {
			data: { name: 'insecticide T with a rather long name for a narrow screen', kind: 'insecticide', unit: 'fl oz', epaRegNo: '1234-56-7890', restrictedUse: true, reiHours: 12, phiDays: 21, grazingDays: 7, activeIngredients: 'ingredient one; ingredient two' }
		})).json();
		const variety = await (await page.request.post(`/api/farms/${own.farmId}/varieties`, { data: { crop: 'corn', name: 'hybrid T', relativeMaturity: 104, seedsPerUnit: 80_000, traits: 'insect protected' } })).json();
		expect((await page.request.post(`/api/farms/${own.farmId}/varieties/${variety.id}/lots`, { data: { lotNumber: 'T-1', germinationPct: 95, treatment: 'fungicide seed treatment' } })).status()).toBe(201);

		for (const path of ['products', 'products/new', `products/${product.id}`, 'seeds', `seeds/${variety.id}`]) {
			const res = await page.goto(`/farms/${own.farmId}/${path}`);
			expect(res?.status(), path).toBe(200);
			expect(await page.evaluate(() => document.documentElement.scrollWidth), path).toBeLessThanOrEqual(375);
			const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
			const serious = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}`);
			expect(serious, path).toEqual([]);
			for (const button of await page.locator('main button:visible').all()) {
				expect((await button.boundingBox())!.height, `${path}: ${await button.textContent()}`).toBeGreaterThanOrEqual(44);
			}
		}
	});
});

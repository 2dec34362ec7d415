import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

const SEASON = new Date().getUTCFullYear();

test('a record reads as sentences: spaces between the pieces, units on every number, edits in words', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'words');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Words 80', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	const product = await page.request.post(`/api/farms/${farmId}/products`, {
		data: { name: 'insecticide W', kind: 'insecticide', unit: 'fl oz', epaRegNo: '1234-56', restrictedUse: true, reiHours: 12, phiDays: 21 }
	});
	expect(product.status(), await product.text()).toBe(201);
	const productId = (await product.json()).id;
	const created = await page.request.post(`/api/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records`, {
		data: {
			type: 'spraying', startedAt: `${SEASON}-01-05T08:00:00-06:00`, endedAt: `${SEASON}-01-05T10:00:00-06:00`, laneIndexes: [0, 2],
			products: [{ productId, rate: 32, rateUnit: 'fl oz/ac' }], applicator: 'Pat Field', applicatorCertNumber: 'CERT-77',
			weather: { tempF: 41, windMph: 7, windFrom: 'NW' }
		}
	});
	expect(created.status(), await created.text()).toBe(201);
	const recordId = (await created.json()).id;

	const seasonPage = `/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}`;
	await page.goto(seasonPage);
	await expect(page.getByTestId('record-product').first()).toContainText(/^insecticide W \(EPA reg\. no\. 1234-56\): 32 fl oz\/ac, total [\d.,]+ fl oz = [\d.,]+ gal$/);

	await page.goto(`${seasonPage}/records/${recordId}`);
	const facts = page.getByRole('region', { name: 'What was done' }).or(page.locator('section', { has: page.getByRole('heading', { name: 'What was done' }) }));
	await expect(facts.locator('dd').filter({ hasText: 'Pat Field' })).toHaveText('Pat Field · certification CERT-77');
	await expect(facts.locator('dd').filter({ hasText: '°F' })).toHaveText('41 °F · wind 7 mph from NW');
	await expect(page.getByTestId('product-row').locator('td').first()).toHaveText('insecticide W (restricted use)');
	await expect(page.getByTestId('product-row').locator('td').nth(3)).toHaveText(/^[\d.,]+ fl oz \([\d.,]+ gal\)$/);

	await page.getByText('Edit this record').click();
	await page.getByLabel('Wind speed (mph)').fill('9');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Record saved.' })).toBeVisible();
	const edit = page.getByTestId('history-entry').nth(1);
	await expect(edit).toContainText('Weather: 41 °F, wind 7 mph from NW → 41 °F, wind 9 mph from NW');
	await expect(edit).not.toContainText('{');

	await page.goto(`/farms/${farmId}/team`);
	await expect(page.getByRole('cell', { name: /\(you\)$/ })).toHaveText('Test words (you)');
});

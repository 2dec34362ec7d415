import { expect, test } from '@playwright/test';
import { ownFarm, ownField } from './own-farm';
import { rectangle } from '../fixtures/rectangle';

test('a field edit made on a stale page is refused with a message, and the newer save stays', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'stale-edit');
	const fieldId = await ownField(page.request, farmId, 'Stale test', rectangle(660, 1320, -94.33, 43.72));
	await page.goto(`/farms/${farmId}/fields/${fieldId}/edit`);
	await expect(page.getByRole('heading', { level: 1, name: 'Edit Stale test' })).toBeVisible();

	// Someone else saves while this page is open.
	const theirs = await page.request.patch(`/api/farms/${farmId}/fields/${fieldId}`, { data: { name: 'Saved elsewhere', version: 1 } });
	expect(theirs.status()).toBe(200);

	await page.getByLabel('Field name').fill('Mine');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByRole('alert')).toContainText('Someone else saved this field after you opened it (version 2, yours 1). Reload to see their changes; nothing of yours was saved.');
	await expect(page.getByLabel('Field name')).toHaveValue('Mine');
	const stored = await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}`)).json();
	expect(stored).toMatchObject({ name: 'Saved elsewhere', version: 2 });

	// Reloading shows their save; the same change then goes through.
	await page.getByRole('link', { name: 'Reload the saved field' }).click();
	await expect(page.getByLabel('Field name')).toHaveValue('Saved elsewhere');
	await page.getByLabel('Field name').fill('Mine');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Mine' })).toBeVisible();
	expect(await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}`)).json()).toMatchObject({ name: 'Mine', version: 3 });
});

import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, apiSignIn, signUp, uniqueEmail, waitForMail } from './helpers';

test('a user of two farms switches between them from the header', async ({ page }) => {
	await signUp(page, 'Two Farms', uniqueEmail('twofarms'));
	for (const name of ['Alpha Acres test', 'Bravo Bottoms test']) {
		await page.goto('/farms');
		await page.getByLabel('Farm name').fill(name);
		await page.getByRole('button', { name: 'Create farm' }).click();
		await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
	}
	const switcher = page.getByLabel('Switch farm');
	await expect(switcher).toHaveValue(/.+/);
	await switcher.selectOption({ label: 'Alpha Acres test' });
	await expect(page.getByRole('heading', { level: 1, name: 'Alpha Acres test' })).toBeVisible();
	await page.getByLabel('Switch farm').selectOption({ label: 'Bravo Bottoms test' });
	await expect(page.getByRole('heading', { level: 1, name: 'Bravo Bottoms test' })).toBeVisible();
});

test('the dev mailbox shows a signed-in user only the mail addressed to them', async ({ page, request }) => {
	await page.goto('/dev/mailbox');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fdev%2Fmailbox$/);
	const email = uniqueEmail('mailbox');
	await signUp(page, 'Mailbox Reader', email);
	for (const to of [email, 'owner@demo.stripwright.test']) {
		await page.goto('/forgot-password');
		await page.getByLabel('E-mail').fill(to);
		await page.getByRole('button', { name: 'Send reset link' }).click();
		await waitForMail(request, to, /Reset your Stripwright password/);
	}
	await page.goto('/dev/mailbox');
	await expect(page.getByRole('heading', { name: 'Dev mailbox' })).toBeVisible();
	const resets = page.getByRole('listitem').filter({ hasText: 'Reset your Stripwright password' });
	await expect(resets).toHaveCount(1);
	await expect(resets.getByText(`to ${email} ·`)).toBeVisible();
	await expect(page.getByText('owner@demo.stripwright.test')).toHaveCount(0);
});

test.describe('on a phone', () => {
	test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });
	test('the menu opens with a tap and every target is at least 44 px tall', async ({ page }) => {
		await apiSignIn(page.request, 'crew');
		await page.goto(`/farms/${DEMO_FARM_ID}`);
		const menu = page.getByText('Menu ▾');
		await expect(menu).toBeVisible();
		await menu.tap();
		const fields = page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fields' }).first();
		await expect(fields).toBeVisible();
		for (const target of [menu, fields]) expect((await target.boundingBox())!.height).toBeGreaterThanOrEqual(44);
		await fields.tap();
		await expect(page.getByRole('heading', { level: 1, name: 'Fields' })).toBeVisible();
		// Nothing overflows sideways on a phone.
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	});
});

test.describe('plan page on a phone', () => {
	test.use({ viewport: { width: 390, height: 844 } });
	test('nothing widens the page: wide tables scroll inside their box', async ({ page }) => {
		await apiSignIn(page.request, 'owner');
		await page.goto(`/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2/plans/2026`);
		await expect(page.getByTestId('lane-table')).toBeVisible();
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		const map = (await page.getByRole('region', { name: /Lanes of Creek Bend/ }).boundingBox())!;
		expect(map.x + map.width).toBeLessThanOrEqual(390);
	});
});

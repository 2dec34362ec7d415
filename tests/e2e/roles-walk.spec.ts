import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, apiSignIn } from './helpers';
import { joinOwnFarm, ownFarm, ownField } from './own-farm';
import { rectangle } from '../fixtures/rectangle';

// Every protected page, for every role: the status each must answer (the product's roles table).
const PAGES: { path: string; allowed: string[] }[] = [
	{ path: `/farms/${DEMO_FARM_ID}`, allowed: ['owner', 'manager', 'crew', 'advisor', 'viewer'] },
	{ path: `/farms/${DEMO_FARM_ID}/team`, allowed: ['owner', 'manager', 'crew', 'advisor', 'viewer'] },
	{ path: `/farms/${DEMO_FARM_ID}/settings`, allowed: ['owner'] }
];

for (const role of ['owner', 'manager', 'crew', 'advisor', 'viewer']) {
	test(`${role} gets the right answer on every farm page`, async ({ page }) => {
		await apiSignIn(page.request, role);
		for (const p of PAGES) {
			const res = await page.goto(p.path);
			expect(res?.status(), `${role} ${p.path}`).toBe(p.allowed.includes(role) ? 200 : 403);
		}
		// Another farm's id, or a made-up one, answers 404 and reveals nothing.
		const res = await page.goto('/farms/00000000-0000-4000-8000-000000000000/team');
		expect(res?.status()).toBe(404);
		await expect(page.getByText('No farm here')).toBeVisible();
	});
}

test('signed-out visitors are sent to sign in and come back', async ({ page }) => {
	await page.goto(`/farms/${DEMO_FARM_ID}/team`);
	await expect(page).toHaveURL(new RegExp(`/sign-in\\?redirectTo=${encodeURIComponent(`/farms/${DEMO_FARM_ID}/team`)}`));
	await page.getByLabel('E-mail').fill('manager@demo.stripwright.test');
	await page.getByLabel('Password').fill('stripwright-demo');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${DEMO_FARM_ID}/team$`));
});

test('non-owners cannot post owner actions', async ({ page }) => {
	await apiSignIn(page.request, 'manager');
	const res = await page.request.post(`/farms/${DEMO_FARM_ID}/team?/invite`, {
		form: { email: 'x@example.test', role: 'crew' },
		headers: { origin: new URL(test.info().project.use.baseURL!).origin, accept: 'application/json' }
	});
	expect(res.status()).toBe(403);
	const body = await res.json();
	expect(body.type).toBe('error');
	expect(body.error.message).toMatch(/is Manager, which cannot manage members/);
});

test('the owner grants a viewer a field, and the viewer then sees it and no other', async ({ browser }) => {
	// A farm of its own, so the demo viewer's fields stay as seeded for the tests that read them.
	const page = await (await browser.newContext()).newPage();
	const farm = await ownFarm(page, 'granter');
	await ownField(page.request, farm.farmId, 'Upper field', rectangle(600, 600, -94.41, 43.61));
	const lowerId = await ownField(page.request, farm.farmId, 'Lower field', rectangle(600, 600, -94.41, 43.6));
	const viewer = await joinOwnFarm(browser, page, farm, 'viewer');
	await viewer.page.goto(`/farms/${farm.farmId}/fields`);
	await expect(viewer.page.getByText('Upper field')).toHaveCount(0);

	await page.goto(`/farms/${farm.farmId}/team`);
	const grants = page.getByTestId(`grants-${viewer.email}`);
	await expect(grants.getByLabel('Upper field')).not.toBeChecked();
	await expect(grants.getByLabel('Lower field')).not.toBeChecked();
	await grants.getByLabel('Upper field').check();
	await grants.getByRole('button', { name: /Save what/ }).click();
	await expect(page.getByRole('status').filter({ hasText: 'now sees 1 field' })).toBeVisible();

	await viewer.page.goto(`/farms/${farm.farmId}/fields`);
	await expect(viewer.page.getByTestId('fields-table')).toContainText('Upper field');
	await expect(viewer.page.getByTestId('fields-table')).not.toContainText('Lower field');
	// Viewers cannot grant themselves more.
	const res = await viewer.page.request.post(`/farms/${farm.farmId}/team?/grantFields`, { form: { userId: '5a1e0000-0000-4000-8000-0000000000a5', fieldId: lowerId }, headers: { origin: new URL(viewer.page.url()).origin, accept: 'application/json' } });
	expect(res.status()).toBe(403);
	await viewer.page.goto(`/farms/${farm.farmId}/fields`);
	await expect(viewer.page.getByTestId('fields-table')).not.toContainText('Lower field');
	await viewer.page.context().close();
	await page.context().close();
});

import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, apiSignIn } from './helpers';

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

test('the owner grants a viewer another field, and the viewer then sees it', async ({ browser }) => {
	const owner = await browser.newContext();
	const page = await owner.newPage();
	await apiSignIn(page.request, 'owner');
	await page.goto(`/farms/${DEMO_FARM_ID}/team`);
	const grants = page.getByTestId('grants-viewer@demo.stripwright.test');
	await expect(grants.getByLabel('Creek Bend')).toBeChecked();
	await expect(grants.getByLabel('North 80')).not.toBeChecked();
	await grants.getByLabel('North 80').check();
	await grants.getByRole('button', { name: /Save what/ }).click();
	await expect(page.getByRole('status').filter({ hasText: 'now sees 2 fields' })).toBeVisible();

	const viewer = await browser.newContext();
	const vp = await viewer.newPage();
	await apiSignIn(vp.request, 'viewer');
	await vp.goto(`/farms/${DEMO_FARM_ID}/fields`);
	await expect(vp.getByTestId('fields-table')).toContainText('North 80');
	await expect(vp.getByTestId('fields-table')).not.toContainText('Shelter Lanes');
	// Viewers cannot grant themselves more.
	const res = await vp.request.post(`/farms/${DEMO_FARM_ID}/team?/grantFields`, { form: { userId: '5a1e0000-0000-4000-8000-0000000000a5', fieldId: '5a1e0000-0000-4000-8000-0000000001f3' }, headers: { origin: new URL(vp.url()).origin, accept: 'application/json' } });
	expect(res.status()).toBe(403);
	await viewer.close();

	// Back as it was, for the other specs that read the demo viewer's fields.
	await grants.getByLabel('North 80').uncheck();
	await grants.getByRole('button', { name: /Save what/ }).click();
	await expect(page.getByRole('status').filter({ hasText: 'now sees 1 field' })).toBeVisible();
	await owner.close();
});

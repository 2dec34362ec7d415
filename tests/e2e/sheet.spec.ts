import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, DEMO_PASSWORD, apiSignIn, demoEmail, waitForMail } from './helpers';

const SHELTER = `/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f3`;
const CREEK = `/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2`;

// About the demo scenario: its split planter with row unit 9's nitrogen left open, its crew and
// viewer, read as seeded. No e2e test writes the demo; tests that write make a farm of their own.

test('the plan shows the planter checks; the sheet lists passes, stops on the misplumbed unit and prints cleanly', async ({ page }) => {
	await apiSignIn(page.request, 'manager');
	await page.goto(`${SHELTER}/plans/2026`);
	const checks = page.getByTestId('planter-checks');
	await expect(checks).toContainText('16-row split planter');
	await expect(checks).toContainText(/\brow unit 9\b/);
	await checks.getByRole('link', { name: 'Open the seeding sheet' }).click();

	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Seeding sheet — Shelter Lanes 2026');
	await expect(page.getByTestId('sheet-stops')).toContainText(/STOP: \d+ problems? to fix before planting/);
	await expect(page.getByTestId('sheet-stops')).toContainText(/Nitrogen \(UAN 32 %\) is on at row unit 9\b/);
	// Row units set up alike share a row; unit 9 (soybean, nitrogen open) stands alone.
	const units = page.getByTestId('row-unit-table').locator('tbody tr');
	await expect(units.first()).toContainText('Units 1–8');
	await expect(units.filter({ has: page.getByRole('cell', { name: 'Unit 9', exact: true }) })).toContainText('soybean');
	await expect(page.getByTestId('sheet-passes').locator('li').first()).toContainText(/\bPass 1\b/);
	const plan = await (await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f3/plans/2026`)).json();
	expect(plan.lanes.length).toBeGreaterThan(80);
	// A field of more than 24 lanes: lanes set up alike share a row; every lane is in the appendix.
	const laneRows = page.getByTestId('sheet-lanes').locator('tbody tr');
	await expect(laneRows.filter({ hasText: /^Lanes \d+, \d+, \d+ … \d+ \(\d+\)/ }).first()).toBeVisible();
	expect(await laneRows.count()).toBeLessThan(plan.lanes.length / 4);
	// The drill that is too wide for the pasture lanes (15 ft in 10 ft: 30 in each side).
	await expect(page.getByTestId('sheet-checks')).toContainText('15-ft drill');
	await expect(page.getByTestId('sheet-cautions')).toContainText('The label is the law');

	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
	await expect(page.getByRole('navigation', { name: 'Main' }).first()).toBeHidden();
	await page.screenshot({ path: test.info().outputPath('sheet-print.png'), fullPage: true });
	await page.emulateMedia({ media: 'screen' });
	await page.goto(`${SHELTER}/plans/2026/sheet?appendix=1`);
	await expect(page.getByTestId('sheet-lanes-all').locator('tbody tr')).toHaveCount(plan.lanes.length);

	// PDF of the same sheet.
	const pdf = await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f3/plans/2026/sheet.pdf`);
	expect(pdf.status()).toBe(200);
	expect(pdf.headers()['content-type']).toBe('application/pdf');
	expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
});

test('e-mail the sheet to the crew from the page', async ({ page, request }) => {
	await apiSignIn(page.request, 'owner');
	await page.goto(`${SHELTER}/plans/2027/sheet`);
	await page.getByText('E-mail the PDF to the crew').click();
	await page.getByRole('button', { name: 'Send' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Sent to crew@demo.stripwright.test' })).toBeVisible();
	const mail = await waitForMail(request, demoEmail('crew'), /Seeding sheet: Shelter Lanes 2027/);
	expect(mail.attachments.map((a) => a.contentType)).toEqual(['application/pdf']);
	expect(Buffer.from(mail.attachments[0].base64, 'base64').subarray(0, 5).toString()).toBe('%PDF-');
});

test('who may read the sheet and who may send it', async ({ playwright, baseURL }) => {
	const viewer = await playwright.request.newContext({ baseURL });
	await viewer.post('/api/session', { data: { email: demoEmail('viewer'), password: DEMO_PASSWORD } });
	expect((await viewer.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2/plans/2026/sheet.pdf`)).status()).toBe(200);
	expect((await viewer.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f3/plans/2026/sheet.pdf`)).status()).toBe(404);
	await viewer.dispose();

	const crew = await playwright.request.newContext({ baseURL });
	await crew.post('/api/session', { data: { email: demoEmail('crew'), password: DEMO_PASSWORD } });
	const send = await crew.post(`${CREEK}/plans/2026/sheet?/email`, { form: { to: '5a1e0000-0000-4000-8000-0000000000a3' }, headers: { origin: baseURL!, accept: 'application/json' } });
	expect(send.status()).toBe(403);
	await crew.dispose();

	const anon = await playwright.request.newContext({ baseURL });
	expect((await anon.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2/plans/2026/sheet.pdf`)).status()).toBe(401);
	await anon.dispose();
});

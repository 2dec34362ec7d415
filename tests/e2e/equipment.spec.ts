import { expect, test, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { finishSignUp, firstLink, signUp, uniqueEmail, waitForMail } from './helpers';

/** Signs up a new owner with a farm of their own; returns the farm id. */
async function ownFarm(page: Page, farmName: string): Promise<string> {
	await signUp(page, 'Equipment Owner', uniqueEmail('equip-owner'));
	await page.getByLabel('Farm name').fill(farmName);
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: farmName })).toBeVisible();
	return new URL(page.url()).pathname.split('/')[2];
}

/** The owner invites a new member with this role, who signs up in a browser of their own and joins. */
async function joinAs(browser: Browser, request: APIRequestContext, owner: Page, farmId: string, farmName: string, role: 'crew' | 'viewer'): Promise<Page> {
	const email = uniqueEmail(`equip-${role}`);
	await owner.goto(`/farms/${farmId}/team`);
	await owner.getByLabel('E-mail').fill(email);
	await owner.getByLabel('Role', { exact: true }).selectOption(role);
	await owner.getByRole('button', { name: 'Send invitation' }).click();
	await expect(owner.getByText(`Invitation sent to ${email}`)).toBeVisible();
	const mail = await waitForMail(request, email, new RegExp(`invites you to ${farmName}`));
	const page = await (await browser.newContext()).newPage();
	await page.goto(firstLink(mail.text));
	await page.getByRole('link', { name: 'Create an account' }).click();
	await page.getByLabel('Your name').fill(`Equipment ${role}`);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(`${role} password 123`);
	await page.getByRole('button', { name: 'Create account' }).click();
	await finishSignUp(page, email);
	await page.getByRole('button', { name: new RegExp(`Join ${farmName}`) }).click();
	await expect(page.getByRole('heading', { level: 1, name: farmName })).toBeVisible();
	return page;
}

const origin = () => new URL(test.info().project.use.baseURL!).origin;

test('an owner sets up a 12-row 30-in planter unit by unit, sees 30 ft, saves and finds it in the list', async ({ page }) => {
	const farmId = await ownFarm(page, 'Planter Test Farm');
	await page.goto(`/farms/${farmId}/equipment`);
	await expect(page.getByText('No implements yet')).toBeVisible();
	await page.getByRole('link', { name: 'Add implement' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Add implement' })).toBeVisible();

	await page.getByLabel('Name', { exact: true }).fill('Twelve-row planter');
	await expect(page.getByLabel('Kind of implement')).toHaveValue('planter');
	await page.getByLabel('Number of row units').fill('12');
	await page.getByLabel('Row spacing (in)').fill('30');
	await expect(page.getByTestId('working-width')).toHaveText('30 ft');
	await expect(page.getByText('12 units × 30 in ÷ 12')).toBeVisible();

	await page.getByRole('button', { name: 'Add a fertilizer line' }).click();
	await expect(page.getByTestId('rate-caution')).toContainText('Stripwright does arithmetic, it does not recommend a rate. The label is the law');
	await page.getByLabel('Line 1 name').fill('Nitrogen');
	await page.getByLabel('Line 1 product (optional)').fill('UAN 32 %');
	await page.getByLabel('Line 1 is meant for (crops, comma-separated)').fill('corn');
	await page.getByLabel('Line 1 rate (gal/ac), optional').fill('15');
	await page.getByLabel('Line 1 density (lb/gal), optional').fill('11.06');
	await page.getByLabel('Line 1 nitrogen (% N), optional').fill('32');
	// 15 gal/ac × 11.06 lb/gal × 0.32 = 53.088 lb N/ac
	await expect(page.getByText('= 53.1 lb N/ac')).toBeVisible();

	await page.getByLabel('Units from', { exact: true }).fill('1');
	await page.getByLabel('to', { exact: true }).first().fill('6');
	await page.getByLabel('carry crop').fill('corn');
	await page.getByLabel('variety (optional)').fill('hybrid A');
	await page.getByRole('button', { name: 'Fill seed' }).click();
	await page.getByLabel('Units from', { exact: true }).fill('7');
	await page.getByLabel('to', { exact: true }).first().fill('12');
	await page.getByLabel('carry crop').fill('soybean');
	await page.getByLabel('variety (optional)').fill('');
	await page.getByRole('button', { name: 'Fill seed' }).click();
	await page.getByLabel('units from', { exact: true }).fill('1');
	await page.getByLabel('to', { exact: true }).nth(1).fill('6');
	await page.getByRole('button', { name: 'Turn line on' }).click();

	await expect(page.getByLabel('Unit 1 crop')).toHaveValue('corn');
	await expect(page.getByLabel('Unit 6 variety')).toHaveValue('hybrid A');
	await expect(page.getByLabel('Unit 7 crop')).toHaveValue('soybean');
	await expect(page.getByLabel('Unit 12 crop')).toHaveValue('soybean');
	await expect(page.getByLabel('Line 1 (Nitrogen) on at unit 6', { exact: true })).toBeChecked();
	await expect(page.getByLabel('Line 1 (Nitrogen) on at unit 7', { exact: true })).not.toBeChecked();
	await expect(page.getByTestId('setup-report')).not.toContainText('Check the plumbing');
	// Turning the corn line on over a soybean unit is allowed but flagged at once.
	await page.getByLabel('Line 1 (Nitrogen) on at unit 7', { exact: true }).check();
	await expect(page.getByTestId('setup-report')).toContainText('Nitrogen is meant for corn but is on at row unit 7, which carries soybean.');
	await page.getByLabel('Line 1 (Nitrogen) on at unit 7', { exact: true }).uncheck();
	await expect(page.getByTestId('setup-report')).not.toContainText('Check the plumbing');

	await page.getByLabel('Default planter of the farm').check();
	await page.getByRole('button', { name: 'Save implement' }).click();

	await expect(page).toHaveURL(new RegExp(`/farms/${farmId}/equipment\\?saved=`));
	await expect(page.getByRole('status')).toHaveText('Saved Twelve-row planter.');
	const planters = page.getByRole('region', { name: /Planters/ });
	const item = planters.getByTestId('equipment-item');
	await expect(item).toHaveCount(1);
	await expect(item.getByTestId('equipment-width')).toHaveText('30 ft');
	await expect(item).toContainText('Default planter');
	await expect(item).toContainText('12 row units × 30 in');
	await expect(item).toContainText('corn — hybrid A on row units 1–6; soybean on row units 7–12');
	await expect(item).toContainText('Nitrogen on row units 1–6');

	// The saved setup comes back into the editor unit by unit.
	await item.getByRole('link', { name: 'Twelve-row planter' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Twelve-row planter' })).toBeVisible();
	await expect(page.getByTestId('equipment-width').first()).toHaveText('30 ft');
	await expect(page.getByText('entered rate 15 gal/ac')).toBeVisible();
	await expect(page.getByLabel('Unit 7 crop')).toHaveValue('soybean');
	await expect(page.getByLabel('Line 1 (Nitrogen) on at unit 1', { exact: true })).toBeChecked();
	await expect(page.getByLabel('Line 1 (Nitrogen) on at unit 12', { exact: true })).not.toBeChecked();
});

test('a bad setup is refused with its message beside the input, and a duplicate name beside the name', async ({ page }) => {
	const farmId = await ownFarm(page, 'Refusal Test Farm');
	await page.goto(`/farms/${farmId}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Four-row planter');
	await page.getByLabel('Number of row units').fill('4');
	await page.getByLabel('Row spacing (in)').fill('30');
	await page.getByRole('button', { name: 'Add a fertilizer line' }).click();
	await page.getByLabel('Line 1 name').fill('Starter');
	await page.getByLabel('Line 1 density (lb/gal), optional').fill('20');
	await page.getByRole('button', { name: 'Save implement' }).click();

	await expect(page.getByText('Some values need fixing; see the messages beside them.')).toBeVisible();
	const density = page.getByLabel('Line 1 density (lb/gal), optional');
	await expect(density).toHaveAttribute('aria-invalid', 'true');
	await expect(page.locator(`#${await density.getAttribute('aria-describedby')}`)).toHaveText('Liquid fertilizer weighs 5–15 lb/gal.');
	const crops = page.getByLabel('Line 1 is meant for (crops, comma-separated)');
	await expect(page.locator(`#${await crops.getAttribute('aria-describedby')}`)).toHaveText('Say which crops this line is meant to feed.');
	// What was typed is still there to fix.
	await expect(page.getByLabel('Number of row units')).toHaveValue('4');
	await expect(page.getByLabel('Line 1 name')).toHaveValue('Starter');

	await density.fill('10');
	await crops.fill('corn');
	await page.getByLabel('Number of row units').fill('0');
	await expect(page.getByTestId('working-width')).toHaveText('—');
	await page.getByRole('button', { name: 'Save implement' }).click();
	const count = page.getByLabel('Number of row units');
	await expect(page.locator(`#${await count.getAttribute('aria-describedby')}`)).toHaveText('A planter needs at least one row unit.');

	await page.getByLabel('Number of row units').fill('4');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Four-row planter.');
	await expect(page.getByTestId('equipment-width')).toHaveText('10 ft');

	await page.getByRole('link', { name: 'Add implement' }).click();
	await page.getByLabel('Name', { exact: true }).fill('four-row PLANTER');
	await page.getByLabel('Kind of implement').selectOption('drill');
	await page.getByLabel('Working width (ft)').fill('15');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.locator('#f-name-error')).toHaveText('The farm already has an implement named four-row PLANTER.');
	await expect(page.getByLabel('Working width (ft)')).toHaveValue('15');
});

test('on a 390-px phone the unit table scrolls inside its box, not the page', async ({ browser }) => {
	const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
	const page = await context.newPage();
	const farmId = await ownFarm(page, 'Phone Test Farm');
	await page.goto(`/farms/${farmId}/equipment/new`);
	await page.getByLabel('Number of row units').fill('24');
	for (let i = 0; i < 3; i++) await page.getByRole('button', { name: 'Add a fertilizer line' }).click();
	await expect(page.getByLabel('Unit 24 crop')).toBeVisible();
	const sizes = await page.evaluate(() => {
		const box = document.querySelector('[data-testid="unit-table"]')!.parentElement!;
		return { page: document.documentElement.scrollWidth, boxScroll: box.scrollWidth, boxClient: box.clientWidth };
	});
	expect(sizes.page).toBeLessThanOrEqual(390);
	expect(sizes.boxScroll).toBeGreaterThan(sizes.boxClient);
	const save = await page.getByRole('button', { name: 'Save implement' }).boundingBox();
	expect(save!.height).toBeGreaterThanOrEqual(44);
	await context.close();
});

test('without JavaScript a drill and a planter (setup as JSON) can still be added', async ({ browser }) => {
	const owner = await browser.newPage();
	const farmId = await ownFarm(owner, 'No Script Farm');
	const context = await browser.newContext({ javaScriptEnabled: false, storageState: await owner.context().storageState() });
	const page = await context.newPage();
	await page.goto(`/farms/${farmId}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Box drill');
	await page.getByLabel('Kind of implement').selectOption('drill');
	await page.getByLabel(/^Working width \(ft\)/).fill('15');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Box drill.');

	await page.goto(`/farms/${farmId}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Two-row plot planter');
	const setup = { rowSpacingIn: 30, rowUnits: [{ unit: 1, seed: { crop: 'corn', variety: null }, fertilizerOn: ['n'] }, { unit: 3, seed: null, fertilizerOn: [] }], fertilizerLines: [{ id: 'n', name: 'Nitrogen', forCrops: ['corn'] }] };
	await page.getByLabel(/Row-unit setup as JSON/).fill(JSON.stringify(setup));
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.locator('#f-setup-error')).toContainText("Row units are numbered 1 to 2 from the operator's left; unit 2 is numbered 3.");
	setup.rowUnits[1].unit = 2;
	await page.getByLabel(/Row-unit setup as JSON/).fill(JSON.stringify(setup));
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Two-row plot planter.');
	await expect(page.getByRole('region', { name: /Planters/ }).getByTestId('equipment-width')).toHaveText('5 ft');
	await expect(page.getByRole('region', { name: /Drills and seeders/ }).getByTestId('equipment-width')).toHaveText('15 ft');
	await context.close();
	await owner.close();
});

test('crew and viewer read the list but cannot add, edit or delete', async ({ browser, request, page }) => {
	const farmName = 'Read Only Test Farm';
	const farmId = await ownFarm(page, farmName);
	await page.goto(`/farms/${farmId}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Seed drill');
	await page.getByLabel('Kind of implement').selectOption('drill');
	await page.getByLabel('Working width (ft)').fill('15');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Seed drill.');
	const itemPath = new URL(await page.getByRole('link', { name: 'Seed drill' }).evaluate((a) => (a as HTMLAnchorElement).href)).pathname;
	// Viewers see equipment only once the owner shows it to them.
	await page.goto(`/farms/${farmId}/settings`);
	await page.getByLabel("Show the farm's equipment to viewers (implements, planter setup and checks)").check();
	await page.getByRole('button', { name: 'Save what viewers see' }).click();
	await expect(page.getByText('What viewers see is saved.')).toBeVisible();

	for (const role of ['crew', 'viewer'] as const) {
		const member = await joinAs(browser, request, page, farmId, farmName, role);
		const list = await member.goto(`/farms/${farmId}/equipment`);
		expect(list?.status(), role).toBe(200);
		await expect(member.getByRole('heading', { level: 1, name: 'Equipment' })).toBeVisible();
		await expect(member.getByTestId('equipment-item')).toContainText('Seed drill');
		await expect(member.getByTestId('equipment-width')).toHaveText('15 ft');
		await expect(member.getByRole('link', { name: 'Add implement' })).toHaveCount(0);

		const item = await member.goto(itemPath);
		expect(item?.status(), role).toBe(200);
		await expect(member.getByTestId('equipment-width')).toHaveText('15 ft');
		await expect(member.getByRole('button', { name: 'Save changes' })).toHaveCount(0);
		await expect(member.getByRole('button', { name: /Delete/ })).toHaveCount(0);

		const newPage = await member.goto(`/farms/${farmId}/equipment/new`);
		expect(newPage?.status(), role).toBe(403);
		const headers = { origin: origin(), accept: 'application/json' };
		const create = await member.request.post(`/farms/${farmId}/equipment/new?/create`, { form: { name: 'Sneaky', kind: 'drill', workingWidthFt: '10' }, headers });
		expect(create.status(), role).toBe(403);
		expect((await create.json()).error.message).toMatch(/which cannot edit fields, plans, equipment and products/);
		const save = await member.request.post(`${itemPath}?/save`, { form: { name: 'Renamed', kind: 'drill', workingWidthFt: '10', version: '1' }, headers });
		expect(save.status(), role).toBe(403);
		const del = await member.request.post(`${itemPath}?/delete`, { form: {}, headers });
		expect(del.status(), role).toBe(403);
		await member.context().close();
	}
	await page.goto(`/farms/${farmId}/equipment`);
	await expect(page.getByTestId('equipment-item')).toHaveCount(1);
	await expect(page.getByTestId('equipment-item')).toContainText('Seed drill');
	await expect(page.getByTestId('equipment-width')).toHaveText('15 ft');
});

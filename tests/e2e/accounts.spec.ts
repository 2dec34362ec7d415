import { expect, test, type APIRequestContext } from '@playwright/test';
import { firstLink, signUp, uniqueEmail, waitForMail } from './helpers';

const origin = () => new URL(test.info().project.use.baseURL!).origin;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Posts a form action as a script would and returns the answer with the address blanked, and its time. */
async function timedPost(request: APIRequestContext, path: string, form: Record<string, string>) {
	const t = performance.now();
	const res = await request.post(path, { form, headers: { origin: origin(), 'x-sveltekit-action': 'true' } });
	const ms = performance.now() - t;
	expect(res.status()).toBe(200);
	return { body: (await res.text()).replaceAll(form.email, '<address>'), ms };
}

test('sign-up and forgot password answer a known address exactly as an unknown one', async ({ page, request }) => {
	const known = uniqueEmail('known');
	await signUp(page, 'Known Person', known, 'known password 1');
	await expect(page).toHaveURL(/\/farms$/);

	const known$: { body: string; ms: number }[] = [];
	const unknown$: { body: string; ms: number }[] = [];
	// Seven rounds: with the sign-up mail before and the note after, nine mails to the known address,
	// within the ten an hour one address may be sent.
	for (let i = 0; i < 7; i++) {
		known$.push(await timedPost(request, '/forgot-password', { email: known }));
		unknown$.push(await timedPost(request, '/forgot-password', { email: uniqueEmail('unknown') }));
	}
	expect(new Set([...known$, ...unknown$].map((r) => r.body)).size).toBe(1);
	expect(known$[0].body).toContain('If an account uses <address>, a reset link is on its way.');
	// Loose on purpose: the point is that neither answer waits for a lookup, a token or a mail.
	const ratio = median(known$.map((r) => r.ms)) / median(unknown$.map((r) => r.ms));
	console.log(`forgot-password median ms: known ${median(known$.map((r) => r.ms)).toFixed(1)}, unknown ${median(unknown$.map((r) => r.ms)).toFixed(1)}`);
	expect(ratio).toBeGreaterThan(1 / 4);
	expect(ratio).toBeLessThan(4);

	const taken = await timedPost(request, '/sign-up', { name: 'Someone', email: known, password: 'another password 2' });
	const fresh = await timedPost(request, '/sign-up', { name: 'Someone', email: uniqueEmail('fresh'), password: 'another password 2' });
	console.log(`sign-up ms: known ${taken.ms.toFixed(1)}, new ${fresh.ms.toFixed(1)}`);
	expect(taken.body).toBe(fresh.body);
	expect(taken.body).toContain('Check your inbox at <address>: we sent a link to finish creating your account.');

	// Only the mail to the known address tells it apart, with a way back in.
	const note = await waitForMail(request, known, /^You already have a Stripwright account$/);
	await page.goto(firstLink(note.text));
	await expect(page.getByText(`For ${known}.`)).toBeVisible();
	await expect(page.getByRole('button', { name: 'Set new password' })).toBeVisible();
});

test('changing the password on the account page signs out the other browser, not this one', async ({ browser, page }) => {
	const email = uniqueEmail('changer');
	await signUp(page, 'Password Changer', email, 'first password 1');
	const other = await browser.newContext();
	const phone = await other.newPage();
	await phone.goto('/sign-in');
	await phone.getByLabel('E-mail').fill(email);
	await phone.getByLabel('Password').fill('first password 1');
	await phone.getByRole('button', { name: 'Sign in' }).click();
	await expect(phone).toHaveURL(/\/farms$/);

	await page.goto('/account');
	await page.getByLabel('Current password').fill('not my password');
	await page.getByLabel('New password', { exact: true }).fill('second password 2');
	await page.getByLabel('New password again').fill('second password 2');
	await page.getByRole('button', { name: 'Change password' }).click();
	await expect(page.getByText('That is not your current password.')).toBeVisible();

	await page.getByLabel('Current password').fill('first password 1');
	await page.getByLabel('New password', { exact: true }).fill('second password 2');
	await page.getByLabel('New password again').fill('second password 2');
	await page.getByRole('button', { name: 'Change password' }).click();
	await expect(page.getByText('Password changed. You were signed out everywhere else.')).toBeVisible();

	await page.goto('/farms');
	await expect(page).toHaveURL(/\/farms$/);
	await phone.goto('/farms');
	await expect(phone).toHaveURL(/\/sign-in\?redirectTo=%2Ffarms/);
	await other.close();
});

test('an invitation opened by another account is refused, and sign-in never redirects off-site', async ({ browser, page, request }) => {
	await signUp(page, 'Inviting Owner', uniqueEmail('inviter'));
	await page.getByLabel('Farm name').fill('Addressee Test Farm');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Addressee Test Farm' })).toBeVisible();
	await page.getByRole('link', { name: 'Team' }).first().click();
	const invited = uniqueEmail('invited');
	await page.getByLabel('E-mail').fill(invited);
	await page.getByLabel('Role', { exact: true }).selectOption('manager');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	const link = firstLink((await waitForMail(request, invited, /invites you to Addressee Test Farm/)).text);

	const context = await browser.newContext();
	const other = await context.newPage();
	const otherEmail = uniqueEmail('forwarded');
	await signUp(other, 'Forwarded To', otherEmail);
	await other.goto(link);
	await expect(other.getByText(`This invitation is for ${invited}, but you are signed in as ${otherEmail}.`)).toBeVisible();
	await expect(other.getByRole('button', { name: /Join Addressee Test Farm/ })).toHaveCount(0);
	// A crafted post is refused the same way.
	const res = await other.request.post(`${new URL(link).pathname}?/accept`, { form: { accept: 'yes' }, headers: { origin: origin() } });
	expect(await res.text()).toContain(`This invitation is for ${invited}`);
	await other.goto('/farms');
	await expect(other.getByText('You do not belong to a farm yet')).toBeVisible();

	// Signing out and in again, with a tab smuggled into the redirect, lands on our own farm list.
	expect((await other.request.post('/sign-out', { form: { leave: 'yes' }, headers: { origin: origin(), accept: 'text/html' }, maxRedirects: 0 })).status()).toBe(303);
	await other.goto('/sign-in?redirectTo=/%09/evil.example');
	await other.getByLabel('E-mail').fill(otherEmail);
	await other.getByLabel('Password').fill('a good long password');
	await other.getByRole('button', { name: 'Sign in' }).click();
	await expect(other).toHaveURL(`${origin()}/farms`);
	await context.close();
});

test("a viewer sees members' e-mails and the equipment only once the owner shows them", async ({ browser, page, request }) => {
	const ownerEmail = uniqueEmail('private-owner');
	await signUp(page, 'Private Owner', ownerEmail);
	await page.getByLabel('Farm name').fill('Privacy Test Farm');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Privacy Test Farm' })).toBeVisible();
	const farmPath = new URL(page.url()).pathname;
	await page.goto(`${farmPath}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Landlord-hidden drill');
	await page.getByLabel('Kind of implement').selectOption('drill');
	await page.getByLabel('Working width (ft)').fill('15');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Landlord-hidden drill.');

	await page.goto(`${farmPath}/team`);
	const viewerEmail = uniqueEmail('landlord');
	await page.getByLabel('E-mail').fill(viewerEmail);
	await page.getByLabel('Role', { exact: true }).selectOption('viewer');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	const link = firstLink((await waitForMail(request, viewerEmail, /invites you to Privacy Test Farm/)).text);
	const context = await browser.newContext();
	const viewer = await context.newPage();
	await signUp(viewer, 'Land Lord', viewerEmail);
	await viewer.goto(link);
	await viewer.getByRole('button', { name: /Join Privacy Test Farm/ }).click();
	await expect(viewer.getByText('You are Viewer here')).toBeVisible();

	await viewer.goto(`${farmPath}/team`);
	await expect(viewer.getByRole('cell', { name: 'Private Owner', exact: true })).toBeVisible();
	await expect(viewer.getByText(ownerEmail)).toHaveCount(0);
	await expect(viewer.getByRole('columnheader', { name: 'E-mail' })).toHaveCount(0);
	await viewer.goto(`${farmPath}/equipment`);
	await expect(viewer.getByText("The farm's owner has not chosen to show its equipment to viewers.")).toBeVisible();
	await expect(viewer.getByText('Landlord-hidden drill')).toHaveCount(0);

	await page.goto(`${farmPath}/settings`);
	await page.getByLabel("Show members' e-mail addresses to viewers").check();
	await page.getByLabel("Show the farm's equipment to viewers (implements, planter setup and checks)").check();
	await page.getByRole('button', { name: 'Save what viewers see' }).click();
	await expect(page.getByText('What viewers see is saved.')).toBeVisible();

	await viewer.goto(`${farmPath}/team`);
	await expect(viewer.getByRole('cell', { name: ownerEmail, exact: true })).toBeVisible();
	await viewer.goto(`${farmPath}/equipment`);
	await expect(viewer.getByText('Landlord-hidden drill').first()).toBeVisible();
	await context.close();
});

import { expect, test } from '@playwright/test';
import { finishSignUp, firstLink, recordingContext, signUp, uniqueEmail, waitForMail } from './helpers';

test('sign up, create a farm, invite a member who accepts in another browser, role limits what they see', async ({ browser, request }) => {
	const owner = await recordingContext(browser);
	const page = await owner.context.newPage();
	const ownerEmail = uniqueEmail('owner');
	await signUp(page, 'Owner Tester', ownerEmail);
	await expect(page).toHaveURL(/\/farms$/);
	await expect(page.getByText('You do not belong to a farm yet')).toBeVisible();

	await page.getByLabel('Farm name').fill('Test Meadow Farm');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Test Meadow Farm' })).toBeVisible();
	await expect(page.getByText('You are Owner here')).toBeVisible();
	const farmUrl = page.url();

	await page.getByRole('link', { name: 'Team' }).first().click();
	const crewEmail = uniqueEmail('crew');
	await page.getByLabel('E-mail').fill(crewEmail);
	await page.getByLabel('Role', { exact: true }).selectOption('crew');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${crewEmail}`)).toBeVisible();
	await expect(page.getByText(crewEmail, { exact: true })).toBeVisible();

	const mail = await waitForMail(request, crewEmail, /invites you to Test Meadow Farm/);
	expect(mail.text).toContain('as Crew');
	const link = firstLink(mail.text);
	expect(new URL(link).hostname).toBe('127.0.0.1');

	// The invitee opens the link in a separate browser context, with no session.
	const invitee = await recordingContext(browser);
	const p2 = await invitee.context.newPage();
	await p2.goto(link);
	await expect(p2.getByText(/invites .* to join Test Meadow Farm as Crew/)).toBeVisible();
	await p2.getByRole('link', { name: 'Create an account' }).click();
	// The invited address comes filled in: only that address can accept.
	await expect(p2.getByLabel('E-mail')).toHaveValue(crewEmail);
	await p2.getByLabel('Your name').fill('Crew Tester');
	await p2.getByLabel('E-mail').fill(crewEmail);
	await p2.getByLabel('Password').fill('crew password 123');
	await p2.getByRole('button', { name: 'Create account' }).click();
	// The confirmation link brings the invitee back to the invitation, signed in.
	await finishSignUp(p2, crewEmail);
	await expect(p2).toHaveURL(/\/invitations\//);
	await p2.getByRole('button', { name: /Join Test Meadow Farm/ }).click();
	await expect(p2.getByRole('heading', { level: 1, name: 'Test Meadow Farm' })).toBeVisible();
	await expect(p2.getByText('You are Crew here')).toBeVisible();

	// Crew cannot manage the farm: no settings link, and the page itself refuses with 403.
	await expect(p2.getByRole('link', { name: 'Settings' })).toHaveCount(0);
	const res = await p2.goto(`${farmUrl}/settings`);
	expect(res?.status()).toBe(403);
	await expect(p2.getByText('Not allowed for your role')).toBeVisible();
	await p2.goto(`${farmUrl}/team`);
	await expect(p2.getByRole('button', { name: 'Send invitation' })).toHaveCount(0);
	await expect(p2.getByRole('cell', { name: 'Owner Tester', exact: true })).toBeVisible();

	// The owner now sees the crew member on the team page.
	await page.reload();
	await expect(page.getByRole('cell', { name: 'Crew Tester', exact: true })).toBeVisible();

	// A reused invitation link explains itself.
	await p2.goto(link);
	await expect(p2.getByText('This invitation has already been accepted')).toBeVisible();

	for (const hosts of [owner.hosts, invitee.hosts]) {
		expect([...hosts]).toEqual(['127.0.0.1']);
	}
	await owner.context.close();
	await invitee.context.close();
});

test('password reset by e-mail ends the old sessions', async ({ browser, request }) => {
	const { context, hosts } = await recordingContext(browser);
	const page = await context.newPage();
	const email = uniqueEmail('forgetful');
	await signUp(page, 'Forgetful Tester', email, 'first password 1');
	await expect(page).toHaveURL(/\/farms$/);

	const other = await browser.newContext();
	const p2 = await other.newPage();
	await p2.goto('/forgot-password');
	await p2.getByLabel('E-mail').fill(email);
	await p2.getByRole('button', { name: 'Send reset link' }).click();
	await expect(p2.getByText(`If an account uses ${email}, a reset link is on its way`)).toBeVisible();
	const mail = await waitForMail(request, email, /Reset your Stripwright password/);
	await p2.goto(firstLink(mail.text));
	await p2.getByLabel('New password', { exact: true }).fill('second password 2');
	await p2.getByLabel('New password again').fill('second password 2');
	await p2.getByRole('button', { name: 'Set new password' }).click();
	await expect(p2.getByText('Your password was changed')).toBeVisible();

	// The first browser's session was ended by the reset.
	await page.goto('/farms');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Ffarms/);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('second password 2');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/farms$/);

	// Used once: the same link now explains that it was used.
	await p2.goto(firstLink(mail.text));
	await expect(p2.getByText('This reset link has already been used')).toBeVisible();
	expect([...hosts]).toEqual(['127.0.0.1']);
	await context.close();
	await other.close();
});

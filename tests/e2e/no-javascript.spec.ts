import { expect, test } from '@playwright/test';
import { DEMO_PASSWORD, demoEmail, finishSignUp, uniqueEmail } from './helpers';

test.use({ javaScriptEnabled: false });

test('forms work without JavaScript and show field errors from the server', async ({ page }) => {
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('No Script');
	await page.getByLabel('E-mail').fill('not-an-email');
	await page.getByLabel('Password').fill('short');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByText('Enter an e-mail address like name@example.com.')).toBeVisible();
	await expect(page.getByText('Use at least 10 characters.')).toBeVisible();
	await expect(page.getByLabel('Password')).toHaveValue(''); // never echoed back
	await expect(page.getByLabel('Your name')).toHaveValue('No Script');

	// A taken address gets the same answer as a new one; only the mail sent to it says it is taken.
	await page.getByLabel('E-mail').fill(demoEmail('owner'));
	await page.getByLabel('Password').fill('long enough password');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByText(`Check your inbox at ${demoEmail('owner')}: we sent a link to finish creating your account.`)).toBeVisible();

	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(demoEmail('crew'));
	await page.getByLabel('Password').fill('wrong password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('That e-mail and password do not match an account.')).toBeVisible();

	await page.getByLabel('E-mail').fill(demoEmail('crew'));
	await page.getByLabel('Password').fill(DEMO_PASSWORD);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('link', { name: /Larkspur Ridge Farm/ })).toBeVisible();

	await page.getByLabel('Farm name').fill('');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByText('Give the farm a name.')).toBeVisible();
});

test('a fresh visitor signs up without JavaScript', async ({ page }) => {
	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Plain Form');
	const email = uniqueEmail('plain');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('plain forms work');
	await page.getByRole('button', { name: 'Create account' }).click();
	await finishSignUp(page, email);
	await expect(page).toHaveURL(/\/farms$/);
});

// Reading the livestock forms: text from the browser into the API's shapes, and domain refusals
// into messages beside the form.
import { fail } from '@sveltejs/kit';
import { AppError } from '$lib/server/errors';

/** A number from a form field, or undefined when left empty (NaN stays, for the schema to refuse). */
export function formNumber(form: FormData, name: string): number | undefined {
	const raw = String(form.get(name) ?? '').trim().replace(/,/g, '');
	return raw === '' ? undefined : Number(raw);
}

export function formText(form: FormData, name: string): string {
	return String(form.get(name) ?? '').trim();
}

/** Every text value of the form, to refill it after a refusal. */
export function formValues(form: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') values[k] = v;
	return values;
}

/** A refusal the user can act on becomes a message beside the form; anything else is a fault. */
export function refusal(e: unknown, form: string, values: Record<string, string>) {
	if (e instanceof AppError && e.status < 500) {
		return fail(e.status, { form, message: e.message, code: e.code, errors: e.fields ?? {}, values });
	}
	throw e;
}

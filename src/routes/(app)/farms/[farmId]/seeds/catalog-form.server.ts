// Reads the variety and seed-lot forms of the seed catalogue pages into the API's schemas.
import { error, fail } from '@sveltejs/kit';
import { seedLotCreateSchema, varietyCreateSchema, type SeedLotInput, type VarietyInput } from '$lib/schemas/varieties';
import { AppError } from '$lib/server/errors';
import { zodFields } from '$lib/server/api';
import type { FarmAccess } from '$lib/server/access';
import { getVariety, type Variety } from '$lib/server/varieties';
import type { LotFormValues, VarietyFormValues } from '$lib/components/catalog/variety-form';

export function varietyValuesOf(v: Variety): VarietyFormValues {
	const n = (x: number | null) => (x === null ? '' : String(x));
	return { crop: v.crop, name: v.name, relativeMaturity: n(v.relativeMaturity), seedsPerUnit: n(v.seedsPerUnit), traits: v.traits ?? '', notes: v.notes ?? '', version: String(v.version) };
}

const NUMBER_WORDS: Record<string, string> = {
	relativeMaturity: 'Enter relative maturity as a number: days for corn (e.g. 105), the maturity group for soybean (e.g. 2.1).',
	seedsPerUnit: 'Enter seeds per unit as a whole number, e.g. 80000.',
	germinationPct: 'Enter germination as a percentage, e.g. 95.',
	unitsOnHand: 'Enter the units on hand as a number, e.g. 40.'
};

function numbers(values: Record<string, string>, keys: string[], raw: Record<string, unknown>, errors: Record<string, string[]>) {
	for (const key of keys) {
		const v = values[key].trim().replace(/,/g, '');
		if (v === '') continue;
		const n = Number(v);
		if (Number.isFinite(n)) raw[key] = n;
		else errors[key] = [NUMBER_WORDS[key]];
	}
}

export async function readVarietyForm(request: Request): Promise<{ ok: true; input: VarietyInput; version: number | null; values: VarietyFormValues } | { ok: false; values: VarietyFormValues; errors: Record<string, string[]> }> {
	const data = await request.formData();
	const text = (k: string) => String(data.get(k) ?? '');
	const values: VarietyFormValues = { crop: text('crop'), name: text('name'), relativeMaturity: text('relativeMaturity'), seedsPerUnit: text('seedsPerUnit'), traits: text('traits'), notes: text('notes'), version: text('version') };
	const errors: Record<string, string[]> = {};
	const raw: Record<string, unknown> = { crop: values.crop, name: values.name, traits: values.traits, notes: values.notes };
	numbers(values as unknown as Record<string, string>, ['relativeMaturity', 'seedsPerUnit'], raw, errors);
	const parsed = varietyCreateSchema.safeParse(raw);
	if (!parsed.success) for (const [k, list] of Object.entries(zodFields(parsed.error))) errors[k] ??= list;
	if (!parsed.success || Object.keys(errors).length) return { ok: false, values, errors };
	const version = values.version.trim() ? Number(values.version) : null;
	return { ok: true, input: parsed.data, version: Number.isInteger(version) ? version : null, values };
}

export async function readLotForm(request: Request): Promise<{ ok: true; input: SeedLotInput; values: LotFormValues } | { ok: false; values: LotFormValues; errors: Record<string, string[]> }> {
	const data = await request.formData();
	const text = (k: string) => String(data.get(k) ?? '');
	const values: LotFormValues = { lotNumber: text('lotNumber'), germinationPct: text('germinationPct'), treatment: text('treatment'), unitsOnHand: text('unitsOnHand') };
	const errors: Record<string, string[]> = {};
	const raw: Record<string, unknown> = { lotNumber: values.lotNumber, treatment: values.treatment };
	numbers(values as unknown as Record<string, string>, ['germinationPct', 'unitsOnHand'], raw, errors);
	const parsed = seedLotCreateSchema.safeParse(raw);
	if (!parsed.success) for (const [k, list] of Object.entries(zodFields(parsed.error))) errors[k] ??= list;
	if (!parsed.success || Object.keys(errors).length) return { ok: false, values, errors };
	return { ok: true, input: parsed.data, values };
}

export async function loadVariety(access: FarmAccess, id: string): Promise<Variety> {
	try {
		return await getVariety(access, id);
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
}

/** An expected refusal from the catalogue module, as the form's answer beside the inputs. */
export function refusal(e: unknown, form: string, values: unknown) {
	if (e instanceof AppError && (e.status === 400 || e.status === 409)) {
		return fail(e.status, { form, values, errors: e.fields ?? {}, message: e.message, conflict: e.status === 409 });
	}
	throw e;
}

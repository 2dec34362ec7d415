// Reads the product form posted by the add and edit pages into the same schema the JSON API uses.
import { error, fail } from '@sveltejs/kit';
import { productCreateSchema, type ProductInput } from '$lib/schemas/products';
import { AppError } from '$lib/server/errors';
import { zodFields } from '$lib/server/api';
import type { FarmAccess } from '$lib/server/access';
import { getProduct, type Product } from '$lib/server/products';
import type { ProductFormValues } from '$lib/components/catalog/product-form';

export function valuesOf(p: Product): ProductFormValues {
	const n = (v: number | null) => (v === null ? '' : String(v));
	return {
		name: p.name,
		kind: p.kind,
		unit: p.unit,
		epaRegNo: p.epaRegNo ?? '',
		restrictedUse: p.restrictedUse,
		reiHours: n(p.reiHours),
		phiDays: n(p.phiDays),
		grazingDays: n(p.grazingDays),
		activeIngredients: p.activeIngredients ?? '',
		formulation: p.formulation ?? '',
		analysis: p.analysis ?? '',
		poundsPerGallon: n(p.poundsPerGallon),
		notes: p.notes ?? '',
		version: String(p.version)
	};
}

const NUMBER_WORDS: Record<string, string> = {
	reiHours: 'Enter the restricted-entry interval in hours, e.g. 12, or leave it empty.',
	phiDays: 'Enter the pre-harvest interval in whole days, e.g. 60, or leave it empty.',
	grazingDays: 'Enter the grazing/feeding interval in whole days, e.g. 30, or leave it empty.',
	poundsPerGallon: 'Enter the weight in lb/gal, e.g. 11.06, or leave it empty.'
};

export type ParsedProductForm =
	| { ok: true; input: ProductInput; version: number | null; values: ProductFormValues }
	| { ok: false; values: ProductFormValues; errors: Record<string, string[]> };

export async function readProductForm(request: Request): Promise<ParsedProductForm> {
	const data = await request.formData();
	const text = (k: string) => String(data.get(k) ?? '');
	const values: ProductFormValues = {
		name: text('name'), kind: text('kind'), unit: text('unit'), epaRegNo: text('epaRegNo'), restrictedUse: data.get('restrictedUse') !== null,
		reiHours: text('reiHours'), phiDays: text('phiDays'), grazingDays: text('grazingDays'), activeIngredients: text('activeIngredients'),
		formulation: text('formulation'), analysis: text('analysis'), poundsPerGallon: text('poundsPerGallon'), notes: text('notes'), version: text('version')
	};
	const errors: Record<string, string[]> = {};
	const raw: Record<string, unknown> = {
		name: values.name, kind: values.kind, unit: values.unit, epaRegNo: values.epaRegNo, restrictedUse: values.restrictedUse,
		activeIngredients: values.activeIngredients, formulation: values.formulation, analysis: values.analysis, notes: values.notes
	};
	for (const key of ['reiHours', 'phiDays', 'grazingDays', 'poundsPerGallon'] as const) {
		const v = values[key].trim().replace(/,/g, '');
		if (v === '') continue;
		const n = Number(v);
		if (Number.isFinite(n)) raw[key] = n;
		else errors[key] = [NUMBER_WORDS[key]];
	}
	const parsed = productCreateSchema.safeParse(raw);
	if (!parsed.success) {
		for (const [k, list] of Object.entries(zodFields(parsed.error))) errors[k] ??= list;
	}
	if (!parsed.success || Object.keys(errors).length) return { ok: false, values, errors };
	const version = values.version.trim() ? Number(values.version) : null;
	return { ok: true, input: parsed.data, version: Number.isInteger(version) ? version : null, values };
}

/** The product of this farm, or the page's 404 (another farm's id answers the same). */
export async function loadProduct(access: FarmAccess, id: string): Promise<Product> {
	try {
		return await getProduct(access, id);
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
}

/** An expected refusal from the product module, as the form's answer beside the inputs. */
export function refusal(e: unknown, values: ProductFormValues) {
	if (e instanceof AppError && (e.status === 400 || e.status === 409)) {
		return fail(e.status, { values, errors: e.fields ?? {}, message: e.message, conflict: e.status === 409 });
	}
	throw e;
}

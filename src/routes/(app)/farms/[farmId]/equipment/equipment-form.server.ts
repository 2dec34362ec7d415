// Reads the implement form posted by the add and edit pages, with or without JavaScript: the row-unit
// setup arrives as JSON either from the editor's hidden input or from the plain textarea.
import { error, fail } from '@sveltejs/kit';
import { equipmentSchema, type EquipmentInput } from '$lib/schemas/equipment';
import { AppError } from '$lib/server/errors';
import type { FarmAccess } from '$lib/server/access';
import { getEquipment } from '$lib/server/equipment';
import type { Equipment, EquipmentKind } from '$lib/equipment/types';

export interface EquipmentFormValues {
	name: string;
	kind: string;
	workingWidthFt: string;
	sections: string;
	rows: string;
	lengthFt: string;
	notes: string;
	isDefaultPlanter: boolean;
	setup: string;
	version: string;
}

export type ParsedEquipmentForm =
	| { ok: true; input: EquipmentInput; values: EquipmentFormValues }
	| { ok: false; values: EquipmentFormValues; errors: Record<string, string[]> };

type NumberKey = 'workingWidthFt' | 'sections' | 'rows' | 'lengthFt';

/** Which inputs each kind uses; the rest of the form is ignored, so a leftover value cannot refuse a save. */
const USES: Record<EquipmentKind, (NumberKey | 'setup')[]> = {
	planter: ['setup'],
	sidedress: ['setup'],
	drill: ['workingWidthFt'],
	sprayer: ['workingWidthFt', 'sections'],
	combine_head: ['workingWidthFt', 'rows'],
	shelter: ['workingWidthFt', 'lengthFt']
};

const NUMBER_WORDS: Record<NumberKey, string> = {
	workingWidthFt: 'Enter the width as a number of feet, e.g. 30 or 12.5.',
	sections: 'Enter the number of boom sections, e.g. 7.',
	rows: 'Enter the number of rows, e.g. 8.',
	lengthFt: 'Enter the length as a number of feet, e.g. 24.'
};

const SETUP_NUMBER_WORDS: Record<string, string> = {
	rowSpacingIn: 'Enter the row spacing in inches, e.g. 30.',
	unit: 'Number each row unit 1, 2, 3 … from the operator\'s left.',
	gallonsPerAcre: 'Enter the rate in gal/ac, or leave it empty.',
	poundsPerGallon: 'Enter the density in lb/gal, or leave it empty.',
	percentN: 'Enter the nitrogen content in %, or leave it empty.'
};

export function emptyValues(kind = 'planter'): EquipmentFormValues {
	return { name: '', kind, workingWidthFt: '', sections: '', rows: '', lengthFt: '', notes: '', isDefaultPlanter: false, setup: '', version: '' };
}

export function valuesOf(e: Equipment): EquipmentFormValues {
	const n = (v: number | null) => (v === null ? '' : String(v));
	return {
		name: e.name,
		kind: e.kind,
		workingWidthFt: n(e.workingWidthFt),
		sections: n(e.sections),
		rows: n(e.rows),
		lengthFt: n(e.lengthFt),
		notes: e.notes ?? '',
		isDefaultPlanter: e.isDefaultPlanter,
		setup: e.planter ? JSON.stringify(e.planter, null, 1) : '',
		version: String(e.version)
	};
}

export async function readEquipmentForm(request: Request): Promise<ParsedEquipmentForm> {
	const data = await request.formData();
	const text = (k: string) => String(data.get(k) ?? '');
	const values: EquipmentFormValues = {
		name: text('name'), kind: text('kind'), workingWidthFt: text('workingWidthFt'), sections: text('sections'), rows: text('rows'),
		lengthFt: text('lengthFt'), notes: text('notes'), isDefaultPlanter: data.get('isDefaultPlanter') !== null, setup: text('setup'), version: text('version')
	};
	const errors: Record<string, string[]> = {};
	const uses = USES[values.kind as EquipmentKind] ?? [];
	const raw: Record<string, unknown> = { name: values.name, kind: values.kind, notes: values.notes, isDefaultPlanter: values.isDefaultPlanter };

	for (const key of ['workingWidthFt', 'sections', 'rows', 'lengthFt'] as const) {
		const v = values[key].trim();
		if (!uses.includes(key) || v === '') continue;
		const n = Number(v);
		if (Number.isFinite(n)) raw[key] = n;
		else errors[key] = [NUMBER_WORDS[key]];
	}
	if (uses.includes('setup') && values.setup.trim()) {
		try {
			raw.planter = JSON.parse(values.setup);
		} catch (e) {
			errors.planter = [`The row-unit setup is not valid JSON: ${(e as Error).message}`];
		}
	}
	if (values.version.trim()) raw.version = Number(values.version);

	const parsed = equipmentSchema.safeParse(raw);
	const fieldErrors: Record<string, string[]> = {};
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = issue.path.length ? issue.path.join('.') : '_';
			if (errors[key]) continue;
			// A planter's width comes from its units; when the setup is missing, say that, not "enter a width".
			if (key === 'workingWidthFt' && uses.includes('setup')) continue;
			// zod's own words for a missing or non-numeric number name types, not the farmer's input.
			const last = String(issue.path[issue.path.length - 1] ?? '');
			const words = issue.code === 'invalid_type' && issue.expected === 'number' ? SETUP_NUMBER_WORDS[last] : undefined;
			(fieldErrors[key] ??= []).push(words ?? issue.message);
		}
		for (const [k, list] of Object.entries(fieldErrors)) errors[k] = [...new Set(list)];
	}
	if (parsed.success && parsed.data.kind === 'sidedress') {
		parsed.data.planter?.rowUnits.forEach((u, i) => {
			if (u.seed) errors[`planter.rowUnits.${i}.seed`] = [`A side-dress toolbar carries no seed; set row unit ${u.unit}'s seed to null.`];
		});
	}
	if (!parsed.success || Object.keys(errors).length) return { ok: false, values, errors };
	return { ok: true, input: parsed.data, values };
}

/** The implement of this farm, or the page's 404 (another farm's id answers the same). */
export async function loadEquipment(access: FarmAccess, id: string): Promise<Equipment> {
	try {
		return await getEquipment(access, id);
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
}

/** An expected refusal from the equipment module, as the form's answer beside the inputs. */
export function refusal(e: unknown, values: EquipmentFormValues) {
	if (e instanceof AppError && (e.status === 400 || e.status === 409)) {
		return fail(e.status, { values, errors: e.fields ?? {}, message: e.message, conflict: e.status === 409 });
	}
	throw e;
}

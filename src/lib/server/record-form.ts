// The record forms of the pages (full form and quick entry) read into the API's input shape, so
// pages and the JSON API go through the same checks and the same module.
import { fail, type ActionFailure } from '@sveltejs/kit';
import { TZDate } from '@date-fns/tz';
import { zodFields } from './api';
import { AppError } from './errors';
import { parseLaneList } from '../plans/lane-selection';
import { recordCreateSchema, type RecordInput } from '../schemas/records';

export const PRODUCT_LINES = 4;
export const SPECIES_LINES = 4;

export type FormValues = Record<string, string>;

export interface FormFailure {
	message: string;
	fields: Record<string, string[]>;
	values: FormValues;
}

/** "2026-06-02T14:30" on the farm's clock → an ISO time with the farm's offset then. */
export function localToIso(value: string, timeZone: string): string | null {
	const m = value.match(/^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/);
	if (!m) return null;
	const d = new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]), 0, timeZone);
	return Number.isNaN(d.getTime()) ? null : d.toISOString();
}

/** An instant as the farm's clock shows it, for a datetime-local input. */
export function isoToLocal(iso: string | Date, timeZone: string): string {
	const d = new TZDate(new Date(iso).getTime(), timeZone);
	const p = (n: number) => String(n).padStart(2, '0');
	return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}`;
}

const num = (v: string | undefined) => (v == null || v.trim() === '' ? undefined : Number(v.replace(/,/g, '')));
const str = (v: string | undefined) => (v == null || v.trim() === '' ? null : v.trim());

/**
 * Reads the full record form. Field errors use the API's keys (laneIndexes, products.0.rate …),
 * so one message table serves both; the lane list is read as people count lanes ("1-4, 9").
 */
export function readRecordForm(form: FormData, laneCount: number, timeZone: string): { input: RecordInput } | { failure: FormFailure } {
	const values: FormValues = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') values[k] = v;
	const fields: Record<string, string[]> = {};
	const lanes = parseLaneList(values.lanes ?? '', laneCount);
	if ('error' in lanes) fields.laneIndexes = [lanes.error];
	const startedAt = localToIso(values.startedAt ?? '', timeZone);
	const endedAt = localToIso(values.endedAt ?? '', timeZone);
	if (!startedAt) fields.startedAt = ['Give the date and time the work started.'];
	if (!endedAt) fields.endedAt = ['Give the date and time the work ended.'];

	const products = [];
	for (let i = 0; i < PRODUCT_LINES; i++) {
		const productId = str(values[`productId_${i}`]);
		if (!productId) continue;
		products.push({ productId, rate: num(values[`rate_${i}`]) ?? Number.NaN, rateUnit: values[`rateUnit_${i}`] ?? '' });
	}
	const species = [];
	for (let i = 0; i < SPECIES_LINES; i++) {
		const name = str(values[`species_${i}`]);
		if (name) species.push({ species: name, rateLbPerAcre: num(values[`speciesRate_${i}`]) ?? Number.NaN });
	}
	const partLane = num(values.partLane);
	const raw = {
		type: values.type,
		startedAt: startedAt ?? '',
		endedAt: endedAt ?? '',
		laneIndexes: 'indexes' in lanes ? lanes.indexes : [0],
		laneParts: partLane != null ? [{ laneIndex: partLane - 1, fromFt: num(values.partFrom) ?? Number.NaN, toFt: num(values.partTo) ?? Number.NaN }] : undefined,
		products,
		applicator: str(values.applicator),
		applicatorCertNumber: str(values.applicatorCertNumber),
		equipment: str(values.equipment),
		weather: { tempF: num(values.tempF) ?? null, windMph: num(values.windMph) ?? null, windFrom: str(values.windFrom) },
		details: {
			variety: str(values.variety),
			populationPerAcre: num(values.populationPerAcre) ?? null,
			depthIn: num(values.depthIn) ?? null,
			seedLot: str(values.seedLot),
			analysis: str(values.analysis),
			placement: str(values.placement),
			method: str(values.method),
			species: species.length ? species : null,
			heightIn: num(values.heightIn) ?? null,
			reason: str(values.reason)
		},
		notes: str(values.notes)
	};
	const parsed = recordCreateSchema.safeParse(raw);
	if (!parsed.success) Object.assign(fields, Object.fromEntries(Object.entries(zodFields(parsed.error)).filter(([k]) => !fields[k] && !(k.startsWith('startedAt') && fields.startedAt))));
	if (Object.keys(fields).length || !parsed.success) {
		return { failure: { message: 'Some values are missing or not valid; see the messages beside them.', fields, values } };
	}
	return { input: parsed.data };
}

/** A domain refusal as the form's failure, keeping what was typed. */
export function formFailure(e: unknown, values: FormValues): ActionFailure<FormFailure> {
	if (e instanceof AppError && e.status < 500) return fail(e.status, { message: e.message, fields: e.fields ?? {}, values });
	throw e;
}

export function formValues(form: FormData): FormValues {
	const values: FormValues = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') values[k] = v;
	return values;
}

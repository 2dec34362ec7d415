// Reads the new-tour form (works without JavaScript: stop rows are plain repeated inputs).
import { TZDate } from '@date-fns/tz';
import { zodFields } from './api';
import { tourCreateSchema, type TourCreateInput } from './tours';

export interface TourFormStop { lat: string; lng: string; title: string; note: string }
export interface TourFormValues { title: string; date: string; expires: string; fieldIds: string[]; stops: TourFormStop[] }

export type ParsedTourForm = { ok: true; input: TourCreateInput; values: TourFormValues } | { ok: false; values: TourFormValues; errors: Record<string, string[]> };

/** "2027-07-16T18:00" on the farm's clock → an ISO time with offset; null when not a time. */
export function localTimeToIso(local: string, timeZone: string): string | null {
	const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local.trim());
	if (!m) return null;
	const [y, mo, d, h, mi] = m.slice(1).map(Number);
	return new TZDate(y, mo - 1, d, h, mi, timeZone).toISOString();
}

export async function readTourForm(request: Request, timeZone: string): Promise<ParsedTourForm> {
	const data = await request.formData();
	const all = (k: string) => data.getAll(k).map((v) => String(v));
	const [lats, lngs, titles, notes] = [all('stopLat'), all('stopLng'), all('stopTitle'), all('stopNote')];
	const stops: TourFormStop[] = lats.map((lat, i) => ({ lat, lng: lngs[i] ?? '', title: titles[i] ?? '', note: notes[i] ?? '' }));
	const values: TourFormValues = {
		title: String(data.get('title') ?? ''),
		date: String(data.get('date') ?? ''),
		expires: String(data.get('expires') ?? ''),
		fieldIds: all('fieldIds'),
		stops
	};
	// Rows left wholly blank are spare rows, not stops.
	const filled = stops.filter((s) => [s.lat, s.lng, s.title, s.note].some((v) => v.trim() !== ''));
	const number = (v: string) => (v.trim() === '' || !Number.isFinite(Number(v)) ? undefined : Number(v));
	const expiresAt = localTimeToIso(values.expires, timeZone);
	const parsed = tourCreateSchema.safeParse({
		title: values.title,
		date: values.date,
		expiresAt: expiresAt ?? undefined,
		fieldIds: values.fieldIds,
		stops: filled.map((s) => ({ lat: number(s.lat), lng: number(s.lng), title: s.title, note: s.note }))
	});
	if (!parsed.success) {
		const errors = zodFields(parsed.error);
		if (!expiresAt) errors.expiresAt = ['Give the date and time the link stops working.'];
		return { ok: false, values: { ...values, stops: filled.length ? stops : values.stops }, errors };
	}
	return { ok: true, input: parsed.data, values };
}

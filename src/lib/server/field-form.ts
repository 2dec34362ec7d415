// Reads the field form (details + outline as JSON) posted by the draw/edit pages, with or without JavaScript.
import { fieldCreateSchema } from '../schemas/field';
import { zodFields } from './api';

export interface FieldFormValues {
	name: string;
	farmNumber: string;
	tractNumber: string;
	fieldNumber: string;
	landlord: string;
	notes: string;
	shape: string;
	reason: string;
	version: string;
}

export type ParsedFieldForm =
	| { ok: true; input: ReturnType<typeof fieldCreateSchema.parse>; values: FieldFormValues; reason: string | undefined; version: number | undefined }
	| { ok: false; values: FieldFormValues; errors: Record<string, string[]> };

export async function readFieldForm(request: Request): Promise<ParsedFieldForm> {
	const data = await request.formData();
	const text = (k: string) => String(data.get(k) ?? '');
	const values: FieldFormValues = {
		name: text('name'), farmNumber: text('farmNumber'), tractNumber: text('tractNumber'), fieldNumber: text('fieldNumber'),
		landlord: text('landlord'), notes: text('notes'), shape: text('shape'), reason: text('reason'), version: text('version')
	};
	let shape: { boundary?: unknown; exclusions?: unknown } = {};
	if (values.shape.trim()) {
		try {
			const parsed = JSON.parse(values.shape);
			// Accept {boundary, exclusions}, a bare geometry, or a Feature (pasted without JavaScript).
			shape = parsed?.boundary ? parsed : { boundary: parsed?.type === 'Feature' ? parsed.geometry : parsed, exclusions: [] };
		} catch (e) {
			return { ok: false, values, errors: { boundary: [`The outline is not valid JSON: ${(e as Error).message}`] } };
		}
	}
	if (!shape.boundary) return { ok: false, values, errors: { boundary: ['Draw the field boundary on the map, or paste it as GeoJSON.'] } };
	const parsed = fieldCreateSchema.safeParse({ ...values, boundary: shape.boundary, exclusions: shape.exclusions ?? [] });
	if (!parsed.success) return { ok: false, values, errors: zodFields(parsed.error) };
	const version = values.version ? Number(values.version) : undefined;
	return { ok: true, input: parsed.data, values, reason: values.reason.trim() || undefined, version };
}

import { z } from 'zod';
import { EXCLUSION_KINDS } from '../fields/shape';

// Shape only; measureFieldShape checks rings, crossings and acres with messages that say where.
export const polygonal = z.object({
	type: z.enum(['Polygon', 'MultiPolygon'], { message: 'Must be a GeoJSON Polygon or MultiPolygon.' }),
	coordinates: z.array(z.any()).min(1, 'The outline has no points.')
});

export const exclusionSchema = z.object({
	name: z.string().trim().max(80, 'Use at most 80 characters.').default(''),
	kind: z.enum(EXCLUSION_KINDS, { message: `Kind must be one of: ${EXCLUSION_KINDS.join(', ')}.` }).default('other'),
	geometry: polygonal
});

const optionalText = (max: number) =>
	z.string().trim().max(max, `Use at most ${max} characters.`).nullish().transform((v) => (v ? v : null));

export const fieldDetails = {
	name: z.string().trim().min(1, 'Give the field a name.').max(80, 'Use at most 80 characters.'),
	farmNumber: optionalText(20),
	tractNumber: optionalText(20),
	fieldNumber: optionalText(20),
	landlord: optionalText(120),
	notes: optionalText(2000)
};

export const fieldCreateSchema = z.object({
	...fieldDetails,
	boundary: polygonal,
	exclusions: z.array(exclusionSchema).max(200, 'At most 200 exclusions per field.').default([])
});

export const fieldPatchSchema = z.object({
	name: fieldDetails.name.optional(),
	farmNumber: fieldDetails.farmNumber.optional(),
	tractNumber: fieldDetails.tractNumber.optional(),
	fieldNumber: fieldDetails.fieldNumber.optional(),
	landlord: fieldDetails.landlord.optional(),
	notes: fieldDetails.notes.optional(),
	boundary: polygonal.optional(),
	exclusions: z.array(exclusionSchema).max(200, 'At most 200 exclusions per field.').optional(),
	reason: z.string().trim().max(200).optional(),
	version: z.number({ message: 'Send the version of the field you edited (a whole number), so a newer save is not overwritten.' }).int().positive()
});

export type FieldCreateInput = z.infer<typeof fieldCreateSchema>;
export type FieldPatchInput = z.infer<typeof fieldPatchSchema>;

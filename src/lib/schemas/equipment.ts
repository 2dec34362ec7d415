import { z } from 'zod';
import { EQUIPMENT_KINDS } from '../equipment/types';

const crop = z.string().trim().min(1, 'Name the crop.').max(40);

export const fertilizerLineSchema = z.object({
	id: z.string().trim().min(1, 'Give the line a short key, e.g. n.').max(20).regex(/^[a-z0-9-]+$/, 'Use lower-case letters, digits and dashes for the key.'),
	name: z.string().trim().min(1, 'Name the fertilizer line.').max(80),
	product: z.string().trim().max(80).nullish().transform((v) => v || null),
	forCrops: z.array(crop).min(1, 'Say which crops this line is meant to feed.').max(10),
	gallonsPerAcre: z.number().min(0).max(200, 'Over 200 gal/ac looks like a typo.').nullish().transform((v) => v ?? null),
	poundsPerGallon: z.number().min(5, 'Liquid fertilizer weighs 5–15 lb/gal.').max(15, 'Liquid fertilizer weighs 5–15 lb/gal.').nullish().transform((v) => v ?? null),
	percentN: z.number().gt(0).max(100).nullish().transform((v) => v ?? null)
});

export const rowUnitSchema = z.object({
	unit: z.number().int().min(1),
	seed: z.object({ crop, variety: z.string().trim().max(80).nullish().transform((v) => v || null) }).nullable(),
	fertilizerOn: z.array(z.string()).max(10).default([])
});

export const planterSetupSchema = z
	.object({
		rowSpacingIn: z.number().min(5, 'Row spacing under 5 in is not a planter.').max(120),
		rowUnits: z.array(rowUnitSchema).min(1, 'A planter needs at least one row unit.').max(96, 'At most 96 row units.'),
		fertilizerLines: z.array(fertilizerLineSchema).max(6).default([])
	})
	.superRefine((p, ctx) => {
		p.rowUnits.forEach((u, i) => {
			if (u.unit !== i + 1) ctx.addIssue({ code: 'custom', path: ['rowUnits', i, 'unit'], message: `Row units are numbered 1 to ${p.rowUnits.length} from the operator's left; unit ${i + 1} is numbered ${u.unit}.` });
			for (const id of u.fertilizerOn) {
				if (!p.fertilizerLines.some((l) => l.id === id)) ctx.addIssue({ code: 'custom', path: ['rowUnits', i, 'fertilizerOn'], message: `Row unit ${u.unit} has line "${id}" on, but there is no such fertilizer line.` });
			}
		});
	});

export const equipmentSchema = z
	.object({
		name: z.string().trim().min(1, 'Name the implement.').max(80),
		kind: z.enum(EQUIPMENT_KINDS, { message: 'Choose what kind of implement it is.' }),
		workingWidthFt: z.number({ message: 'Enter the working width in feet.' }).gt(0, 'Working width must be more than 0 ft.').max(200, 'Over 200 ft is wider than any implement.').optional(),
		planter: planterSetupSchema.nullish().transform((v) => v ?? null),
		sections: z.number().int().min(1).max(100).nullish().transform((v) => v ?? null),
		rows: z.number().int().min(1).max(48).nullish().transform((v) => v ?? null),
		lengthFt: z.number().gt(0).max(200).nullish().transform((v) => v ?? null),
		notes: z.string().trim().max(1000).nullish().transform((v) => v || null),
		isDefaultPlanter: z.boolean().default(false),
		version: z.number().int().min(0).optional()
	})
	.superRefine((e, ctx) => {
		if ((e.kind === 'planter' || e.kind === 'sidedress') && !e.planter) {
			ctx.addIssue({ code: 'custom', path: ['planter'], message: 'A planter or side-dress bar needs its row units set up.' });
		}
		if (!e.planter && e.workingWidthFt === undefined) ctx.addIssue({ code: 'custom', path: ['workingWidthFt'], message: 'Enter the working width in feet.' });
		if (e.kind === 'shelter' && e.lengthFt === null) ctx.addIssue({ code: 'custom', path: ['lengthFt'], message: 'Enter the shelter length in feet.' });
		if (e.isDefaultPlanter && e.kind !== 'planter') ctx.addIssue({ code: 'custom', path: ['isDefaultPlanter'], message: 'Only a planter can be the default planter.' });
	});

export type EquipmentInput = z.infer<typeof equipmentSchema>;

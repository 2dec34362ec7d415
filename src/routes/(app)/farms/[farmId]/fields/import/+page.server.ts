import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { createFields } from '$lib/server/fields';
import { readUploadedShapes } from '$lib/server/field-upload';
import { AppError } from '$lib/server/errors';
import { polygonal } from '$lib/schemas/field';
import { fieldDetails } from '$lib/schemas/field';
import { z } from 'zod';
import { zodFields } from '$lib/server/api';

export const load: PageServerLoad = async (event) => {
	await requireMember(event, event.params.farmId, 'editPlans');
	return {};
};

const chosenSchema = z.array(z.object({ name: fieldDetails.name, boundary: polygonal })).min(1, 'Tick at least one shape to import.');

export const actions: Actions = {
	read: async (event) => {
		await requireMember(event, event.params.farmId, 'editPlans');
		try {
			const result = await readUploadedShapes(event.request);
			return { shapes: result.shapes.features.map((f) => ({ name: f.properties.name, acres: f.properties.acres, boundary: f.geometry })), warnings: result.warnings, format: result.format };
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { uploadError: e.message });
			throw e;
		}
	},
	create: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		const data = await event.request.formData();
		let shapes: { name: string; boundary: unknown }[] = [];
		try {
			shapes = JSON.parse(String(data.get('shapes') ?? '[]'));
		} catch {
			return fail(400, { createError: 'The list of shapes was damaged in transit; read the file again.' });
		}
		const picked = data.getAll('pick').map(Number);
		const chosen = picked.map((i) => ({ name: String(data.get(`name-${i}`) ?? '').trim(), boundary: shapes[i]?.boundary }));
		const parsed = chosenSchema.safeParse(chosen);
		if (!parsed.success) {
			const fields = zodFields(parsed.error);
			return fail(400, { createError: Object.entries(fields).map(([k, v]) => (k === '_' ? v.join(' ') : `Shape ${Number(k.split('.')[0]) + 1}: ${v.join(' ')}`)).join(' '), shapes });
		}
		try {
			await createFields(access, parsed.data.map((c) => ({ ...c, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null }) as never));
		} catch (e) {
			if (e instanceof AppError && e.status === 400) return fail(400, { createError: e.message, shapes });
			throw e;
		}
		redirect(303, `/farms/${access.farm.id}/fields`);
	}
};

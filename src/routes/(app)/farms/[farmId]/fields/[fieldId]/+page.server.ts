import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { deleteField, getField, listBoundaryVersions } from '$lib/server/fields';
import { AppError } from '$lib/server/errors';
import { error } from '@sveltejs/kit';
import { listPlans } from '$lib/server/plans';

async function loadField(access: Awaited<ReturnType<typeof requireMember>>, fieldId: string) {
	try {
		return await getField(access, fieldId);
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	const field = await loadField(access, event.params.fieldId);
	const versions = await listBoundaryVersions(access, field.id);
	const asked = Number(event.url.searchParams.get('version'));
	const shown = versions.find((v) => v.version === asked) ?? versions[0];
	return { field, versions, shown, plans: await listPlans(access, field.id) };
};

export const actions: Actions = {
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		await loadField(access, event.params.fieldId);
		await deleteField(access, event.params.fieldId);
		redirect(303, `/farms/${access.farm.id}/fields`);
	}
};

import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { AppError, pageError } from '$lib/server/errors';
import { getField } from '$lib/server/fields';
import { loadSheet } from '$lib/server/sheet';
import { listEquipment } from '$lib/server/equipment';
import { listMembers } from '$lib/server/team';
import { parseSeason } from '$lib/server/season';
import { emailSheet } from '$lib/server/sheet-mail';
import { wantsAppendix } from '$lib/sheet/condensed';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	try {
		const season = parseSeason(event.params.season);
		const planterId = event.url.searchParams.get('planter');
		const variant = event.url.searchParams.get('variant') ?? undefined;
		const sheet = await loadSheet(access, event.params.fieldId, season, { planterId, variant });
		const planters = (await listEquipment(access)).filter((e) => e.kind === 'planter').map((e) => ({ id: e.id, name: e.name, isDefault: e.isDefaultPlanter }));
		const crew = access.can('editPlans') ? (await listMembers(access.farm.id)).filter((m) => m.role !== 'viewer').map((m) => ({ userId: m.userId, name: m.name, email: m.email, role: m.role })) : [];
		return { sheet, planters, planterId, crew, appendix: wantsAppendix(event.url) };
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
};

export const actions: Actions = {
	email: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		await getField(access, event.params.fieldId).catch(pageError);
		const data = await event.request.formData();
		const to = data.getAll('to').map(String);
		try {
			const sent = await emailSheet(access, event.params.fieldId, parseSeason(event.params.season), to, {
				planterId: event.url.searchParams.get('planter'),
				variant: event.url.searchParams.get('variant') ?? undefined
			});
			const now = sent.to.filter((e) => !sent.queued.includes(e));
			const later = sent.queued.length ? ` The mail server did not take the mail to ${sent.queued.join(', ')} just now; it will be sent again automatically.` : '';
			return { emailed: `${now.length ? `Sent to ${now.join(', ')}.` : 'Not sent yet.'}${later}` };
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { emailError: e.message });
			throw e;
		}
	}
};

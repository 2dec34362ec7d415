import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { Actions, PageServerLoad } from './$types';
import { farmNameSchema } from '$lib/schemas/account';
import { farmTimeZoneSchema, farmUnitsSchema } from '$lib/schemas/farm-settings';
import { requireMember } from '$lib/server/access';
import { deleteFarm, getViewerPrivacy, renameFarm, setFarmTimeZone, setFarmUnits, setViewerPrivacy } from '$lib/server/farms';
import { timeZones } from '$lib/time-zones';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'manageFarm');
	const zones = timeZones();
	return {
		form: await superValidate({ name: access.farm.name }, zod4(farmNameSchema)),
		unitsForm: await superValidate({ units: access.farm.units }, zod4(farmUnitsSchema), { id: 'units' }),
		zoneForm: await superValidate({ timeZone: access.farm.timeZone }, zod4(farmTimeZoneSchema), { id: 'timeZone' }),
		// A zone saved before this list existed still shows as chosen.
		zones: zones.includes(access.farm.timeZone) ? zones : [access.farm.timeZone, ...zones],
		privacy: await getViewerPrivacy(access.farm.id)
	};
};

export const actions: Actions = {
	rename: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const form = await superValidate(event.request, zod4(farmNameSchema));
		if (!form.valid) return fail(400, { form });
		await renameFarm(access.farm.id, access.user.id, form.data.name);
		return message(form, 'Farm name saved.');
	},
	units: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const unitsForm = await superValidate(event.request, zod4(farmUnitsSchema), { id: 'units' });
		if (!unitsForm.valid) return fail(400, { unitsForm });
		await setFarmUnits(access.farm.id, access.user.id, unitsForm.data.units);
		return message(unitsForm, unitsForm.data.units === 'metric' ? 'Areas now show in hectares and lengths in metres.' : 'Areas now show in acres and lengths in feet.');
	},
	// Records store instants; only how their days and times read changes with the zone.
	timeZone: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const zoneForm = await superValidate(event.request, zod4(farmTimeZoneSchema), { id: 'timeZone' });
		if (!zoneForm.valid) return fail(400, { zoneForm });
		await setFarmTimeZone(access.farm.id, access.user.id, zoneForm.data.timeZone);
		return message(zoneForm, `Days and times now read in ${zoneForm.data.timeZone}.`);
	},
	// Unchecked boxes are simply absent from the post: absent means "keep hidden".
	privacy: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const data = await event.request.formData();
		const privacy = { memberEmails: data.get('viewersSeeMemberEmails') === 'on', equipment: data.get('viewersSeeEquipment') === 'on' };
		await setViewerPrivacy(access.farm.id, access.user.id, privacy);
		return { privacyMessage: 'What viewers see is saved.' };
	},
	delete: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'manageFarm');
		const data = await event.request.formData();
		if (String(data.get('confirm') ?? '').trim() !== access.farm.name) {
			return fail(400, { deleteError: `Type the farm's name, ${access.farm.name}, exactly to delete it.` });
		}
		await deleteFarm(access.farm.id, access.user.id);
		redirect(303, '/farms');
	}
};

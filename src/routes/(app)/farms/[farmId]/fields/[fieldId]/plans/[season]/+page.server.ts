import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireMember, type FarmAccess } from '$lib/server/access';
import { getBoundaryVersion, getField } from '$lib/server/fields';
import { adoptVariant, deletePlanVariant, getPlan, listPlans, rotationFromPrevious, savePlan } from '$lib/server/plans';
import { AppError, pageError } from '$lib/server/errors';
import { parseSeason } from '$lib/server/season';
import { planSaveSchema } from '$lib/schemas/plan';
import { zodFields } from '$lib/server/api';
import { listEquipment } from '$lib/server/equipment';
import { catalogueForPlans } from '$lib/server/varieties';
import { loadSheet } from '$lib/server/sheet';
import { checkGroupsOf } from '$lib/sheet/condensed';
import type { CondensedWarning } from '$lib/farm/condense';
import { versionedMemo } from '$lib/server/versioned-memo';
import { lanesForTransport } from '$lib/plans/coordinates';
import { createHash } from 'node:crypto';

// Rotation and planter checks are geometry work that depends only on saved versions, so each is
// remembered under the versions it was computed from (see versioned-memo.ts).
const rotations = versionedMemo<Awaited<ReturnType<typeof rotationFromPrevious>>>();
const planterChecks = versionedMemo<PlanterChecks | null>();
// The page shows the first stops and one line per other kind of check; the sheet lists them all.
type PlanterChecks = { planter: string | null; stopCount: number; firstStops: string[]; warningCount: number; warnings: CondensedWarning[] };

const fingerprint = (value: unknown) => createHash('sha1').update(JSON.stringify(value)).digest('base64url');

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	try {
		const season = parseSeason(event.params.season);
		const variant = event.url.searchParams.get('variant') ?? undefined;
		const fieldRead = getField(access, event.params.fieldId);
		const [field, plan, plans, equipment, catalogue] = await Promise.all([
			fieldRead,
			getPlan(access, event.params.fieldId, season, variant).catch((e) => {
				if (e instanceof AppError && e.status === 404 && !variant) return null;
				throw e;
			}),
			listPlans(access, event.params.fieldId, fieldRead),
			listEquipment(access),
			catalogueForPlans(access)
		]);
		const wanted = plan?.boundaryVersion ?? field.boundaryVersion;
		// The field row carries its current outline; only a plan laid out on an older one reads that version.
		const outline = wanted === field.boundaryVersion ? { version: wanted, boundary: field.boundary, exclusions: field.exclusions } : await getBoundaryVersion(access, field.id, wanted);
		const previous = plan && plans.find((p) => p.season === plan.season - 1 && p.adopted);
		const [rotation, checks] = plan
			? await Promise.all([
					previous ? rotations.get(`${plan.id}:${plan.version}<${previous.id}:${previous.version}`, () => rotationFromPrevious(access, plan)) : null,
					// The same checks the cab sheet prints, so problems show while planning, not at the planter.
					planterChecks.get(`${plan.id}:${plan.version}|${access.farm.units}|${fingerprint(equipment)}`, () => checksFromSheet(access, field.id, season, variant))
				])
			: [null, null];
		return {
			equipment: equipment.filter((e) => e.kind !== 'planter' && e.kind !== 'sidedress').map((e) => ({ name: e.name, kind: e.kind, workingWidthFt: e.workingWidthFt })),
			// A viewer the owner shows no equipment gets no planter section at all, not an empty one.
			planterChecks: access.sees.equipment ? checks : null,
			field: { id: field.id, name: field.name, boundaryVersion: field.boundaryVersion, acres: field.acres },
			season,
			// The page keeps assignments once (not again on every lane) and outlines to 1 cm.
			plan: plan && { ...plan, lanes: lanesForTransport(plan.lanes.map(({ assignment: _, ...lane }) => lane)) },
			plans,
			// The seed catalogue the lane assignments pick from.
			catalogue,
			outline: { version: outline.version, boundary: outline.boundary, exclusions: outline.exclusions },
			rotation
		};
	} catch (e) {
		pageError(e);
	}
};

async function checksFromSheet(access: FarmAccess, fieldId: string, season: number, variant: string | undefined): Promise<PlanterChecks | null> {
	try {
		const sheet = await loadSheet(access, fieldId, season, { variant });
		// Said once per kind, as the sheet prints them: "31 passes (1, 2, 3 … 31): Nitrogen is on …".
		const groups = checkGroupsOf(sheet);
		const stops = groups.filter((c) => c.severity === 'stop').map((c) => c.summary);
		// Each kind's one line only: its every finding is on the sheet's full lists, and shipping them
		// here doubled the page's weight for a box most people never open.
		const warnings = groups.filter((c) => c.severity === 'warn').map((c) => ({ ...c, details: [] }));
		return { planter: sheet.equipment?.name ?? null, stopCount: stops.length, firstStops: stops.slice(0, 5), warningCount: warnings.length, warnings };
	} catch (e) {
		if (!(e instanceof AppError)) throw e;
		return null;
	}
}

const seasonUrl = (farmId: string, fieldId: string, season: number, variant?: string) =>
	`/farms/${farmId}/fields/${fieldId}/plans/${season}${variant ? `?variant=${encodeURIComponent(variant)}` : ''}`;

/** Adopting and deleting a variant share one ladder: access → variant → act → back to the season. */
function variantAction(act: typeof adoptVariant | typeof deletePlanVariant) {
	return async (event: RequestEvent) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		await getField(access, event.params.fieldId!).catch(pageError);
		const variant = String((await event.request.formData()).get('variant') ?? '');
		const season = parseSeason(event.params.season!);
		try {
			await act(access, event.params.fieldId!, season, variant);
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { actionError: e.message });
			throw e;
		}
		redirect(303, seasonUrl(access.farm.id, event.params.fieldId!, season));
	};
}

export const actions: Actions = {
	adopt: variantAction(adoptVariant),
	deleteVariant: variantAction(deletePlanVariant),
	// Without JavaScript the editor posts its settings as JSON text; with it, the page uses PUT.
	save: async (event) => {
		const access = await requireMember(event, event.params.farmId, 'editPlans');
		await getField(access, event.params.fieldId).catch(pageError);
		const data = await event.request.formData();
		const season = parseSeason(event.params.season);
		let body: unknown;
		try {
			body = JSON.parse(String(data.get('settings') ?? ''));
		} catch (e) {
			return fail(400, { actionError: `The plan settings are not valid JSON: ${(e as Error).message}` });
		}
		const parsed = planSaveSchema.safeParse(body);
		if (!parsed.success) return fail(400, { actionError: Object.entries(zodFields(parsed.error)).map(([k, v]) => `${k}: ${v.join(' ')}`).join(' · ') });
		try {
			const plan = await savePlan(access, event.params.fieldId, season, parsed.data);
			redirect(303, seasonUrl(access.farm.id, event.params.fieldId, season, plan.adopted ? undefined : plan.variant));
		} catch (e) {
			if (e instanceof AppError) return fail(e.status, { actionError: e.message });
			throw e;
		}
	}
};

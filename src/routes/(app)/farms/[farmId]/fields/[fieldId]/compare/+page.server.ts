import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireMember } from '$lib/server/access';
import { getBoundaryVersion, getField } from '$lib/server/fields';
import { getPlan, listPlans } from '$lib/server/plans';
import { AppError } from '$lib/server/errors';
import { isSeasonText } from '$lib/server/season';
import { rotationMatrix } from '$lib/geometry/index';
import { rotationWarnings } from '$lib/plans/rotation-flags';

export const load: PageServerLoad = async (event) => {
	const access = await requireMember(event, event.params.farmId, 'read');
	try {
		const field = await getField(access, event.params.fieldId);
		const plans = await listPlans(access, field.id);
		const seasons = [...new Set(plans.map((p) => p.season))].sort((x, y) => x - y);
		if (seasons.length === 0) error(404, { message: `${field.name} has no plans to compare yet.`, code: 'not_found' });
		const b = seasonParam(event.url, 'b') ?? seasons.at(-1)!;
		const a = seasonParam(event.url, 'a') ?? seasons.at(-2) ?? b;
		const [pa, pb] = await Promise.all([getPlan(access, field.id, a), getPlan(access, field.id, b)]);
		const [oa, ob] = await Promise.all([getBoundaryVersion(access, field.id, pa.boundaryVersion), getBoundaryVersion(access, field.id, pb.boundaryVersion)]);
		const rotation = rotationMatrix(pa.lanes, pb.lanes);
		const slim = (p: typeof pa) => ({ season: p.season, variant: p.variant, guidance: p.guidance, plantedAcres: p.plantedAcres, byCrop: p.byCrop, lanes: p.lanes.map((l) => ({ index: l.index, crop: l.crop, kind: l.kind, geometry: l.geometry, acres: l.acres, widthFt: l.widthFt, offsetFt: l.offsetFt })) });
		return {
			field: { id: field.id, name: field.name },
			seasons,
			a: { ...slim(pa), outline: oa },
			b: { ...slim(pb), outline: ob },
			rotation,
			warnings: rotationWarnings(pa.lanes, pb.lanes, rotation, JSON.stringify(pa.guidance) === JSON.stringify(pb.guidance))
		};
	} catch (e) {
		if (e instanceof AppError) error(e.status, { message: e.message, code: e.code });
		throw e;
	}
};

/** A season from the query (?a=2025), or null when not given; anything but a crop year is a 400. */
function seasonParam(url: URL, name: 'a' | 'b'): number | null {
	const raw = url.searchParams.get(name);
	if (raw === null || raw === '') return null;
	if (!isSeasonText(raw)) {
		error(400, { message: `The season to compare (?${name}=) must be a year such as 2025, not "${raw.slice(0, 40)}".`, code: 'invalid' });
	}
	return Number(raw);
}

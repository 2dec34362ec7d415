import type { FarmAccess } from './access';
import { getBoundaryVersion, getField } from './fields';
import { getPlan } from './plans';
import { choosePlanter, listEquipment } from './equipment';
import { invalid } from './errors';
import { buildSheet, SheetError } from '../sheet/build';
import type { SheetData } from '../sheet/types';
import { catalogueForPlans } from './varieties';

/** Everything the cab sheet needs, read through the access module and built by the pure builder. */
export async function loadSheet(access: FarmAccess, fieldId: string, season: number, opts: { variant?: string; planterId?: string | null } = {}): Promise<SheetData> {
	const field = await getField(access, fieldId);
	const plan = await getPlan(access, field.id, season, opts.variant);
	const outline = await getBoundaryVersion(access, field.id, plan.boundaryVersion);
	const [equipment, catalogue] = await Promise.all([listEquipment(access), catalogueForPlans(access)]);
	const planter = choosePlanter(equipment, opts.planterId);
	try {
		return buildSheet({
			farmName: access.farm.name,
			fieldName: field.name,
			preparedBy: access.user.name,
			printedAt: new Date(),
			plan,
			outline,
			planter,
			otherImplements: equipment.filter((e) => e.id !== planter?.id),
			catalogue
		});
	} catch (e) {
		if (e instanceof SheetError) throw invalid(e.message);
		throw e;
	}
}

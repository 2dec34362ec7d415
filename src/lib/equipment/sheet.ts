import type { SheetPass } from '../sheet/types';
import type { PlannedPass } from './passes';
import { checkPlanter, seedLabel } from './planter';
import type { PlanterSetup } from './types';

/**
 * Passes as the seeding sheet prints them: seed shown only where the unit is on, fertilizer lines
 * by name.
 *
 * @example toSheetPasses(plan.passes, planter)[0].units[0] // { unit: 1, laneIndex: 0, seed: 'corn — hybrid A', fertilizer: ['Nitrogen'] }
 */
export function toSheetPasses(passes: readonly PlannedPass[], planter: PlanterSetup): SheetPass[] {
	const { lines } = checkPlanter(planter);
	return passes.map((p) => ({
		number: p.number,
		startsAt: p.startsAt,
		laneIndexes: [...p.laneIndexes],
		summary: p.summary,
		unitsOn: p.unitsOn,
		units: p.units.map((u) => ({
			unit: u.unit,
			laneIndex: u.laneIndex,
			seed: u.on ? seedLabel(u.seed) : null,
			fertilizer: u.fertilizerOn.map((id) => lines.get(id)?.name ?? id)
		}))
	}));
}

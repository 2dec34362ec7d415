// The default planter checked against a plan's lanes, summarised per kind of problem. Pure.
import { checkPasses, EquipmentError, planPasses, type PlanterSetup } from '../equipment/index';
import { GeometryError, type Lane, type LaneSpec } from '../geometry/index';

export interface PlanterCheckSummary {
	/** True when nothing stops the planter. */
	ok: boolean;
	stops: number;
	warnings: number;
	/** One line per kind of problem with how many findings it has, STOP kinds first. */
	kinds: { severity: 'stop' | 'warn'; problem: string; count: number }[];
	/** The planter could not be checked at all (its setup is incomplete): the reason. */
	error: string | null;
}

const PROBLEM_WORDS: Record<string, string> = {
	fertilizer_wrong_crop: 'fertilizer line on over a crop it is not for',
	seed_wrong_crop: 'seed box over another crop',
	seed_in_non_crop_lane: 'unit planting into a pasture or buffer lane',
	unit_on_outside_lanes: 'unit on outside the lanes',
	overhang: 'planter reaches onto the next lane',
	partial_pass: 'lane is not a whole number of planter widths',
	spacing_mismatch: 'planter row spacing differs from the lane',
	drive_back_empty: 'pass starts from the same end as the one before',
	rows_not_planted: 'rows no pass plants',
	no_lanes: 'no lanes to plant'
};

/**
 * Plans the planter's passes over the lanes and counts the check findings by kind, as the cab
 * sheet would list them.
 */
export function planterCheckSummary(lanes: readonly Lane[], pattern: readonly LaneSpec[], planter: PlanterSetup): PlanterCheckSummary {
	try {
		const plan = planPasses({ lanes, pattern, planter });
		const checks = checkPasses(plan.passes, plan.lanes, planter);
		const kinds = new Map<string, { severity: 'stop' | 'warn'; problem: string; count: number }>();
		for (const c of checks) {
			const key = `${c.severity}|${c.problem}`;
			const k = kinds.get(key) ?? { severity: c.severity, problem: PROBLEM_WORDS[c.problem] ?? c.problem, count: 0 };
			k.count += 1;
			kinds.set(key, k);
		}
		const list = [...kinds.values()].sort((a, b) => (a.severity === b.severity ? b.count - a.count : a.severity === 'stop' ? -1 : 1));
		const stops = checks.filter((c) => c.severity === 'stop').length;
		return { ok: stops === 0, stops, warnings: checks.length - stops, kinds: list, error: null };
	} catch (e) {
		// A planter set up incompletely, or a stored lane the pass planner cannot read.
		if (!(e instanceof EquipmentError) && !(e instanceof GeometryError)) throw e;
		return { ok: false, stops: 1, warnings: 0, kinds: [], error: e.message };
	}
}

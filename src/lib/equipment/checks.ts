import { equipmentFit } from '../geometry/index';
import { isPlantingLane, resolveLanes, sameCrop, type LaneInput, type PlanLane } from './lanes';
import { driveBackEmptyMessage, type PassUnit, type PlannedPass } from './passes';
import { checkPlanter } from './planter';
import type { CheckFinding, CheckKind, PlanterSetup } from './types';
import { feet, feetWide, inches, laneLabel, unitList } from './words';

/** Finer than a finding's `kind`; each problem is listed under the nearest kind (`KIND_OF`). */
export type CheckProblem =
	| 'fertilizer_wrong_crop'
	| 'seed_wrong_crop'
	| 'seed_in_non_crop_lane'
	| 'unit_on_outside_lanes'
	| 'overhang'
	| 'partial_pass'
	| 'spacing_mismatch'
	| 'drive_back_empty'
	| 'rows_not_planted'
	| 'no_lanes';

/** A finding with the pass and every row unit it concerns (`unit` is the first of them). */
export interface EquipmentCheck extends CheckFinding {
	problem: CheckProblem;
	passNumber: number | null;
	units: number[];
	/** Overhang checks: how far the planter reaches onto the neighbouring lane, inches. */
	overhangIn?: number;
}

const KIND_OF: Record<CheckProblem, CheckKind> = {
	fertilizer_wrong_crop: 'fertilizer_wrong_crop',
	seed_wrong_crop: 'seed_wrong_crop',
	seed_in_non_crop_lane: 'seed_wrong_crop',
	unit_on_outside_lanes: 'other',
	overhang: 'overhang',
	partial_pass: 'partial_pass',
	spacing_mismatch: 'spacing_mismatch',
	drive_back_empty: 'other',
	rows_not_planted: 'other',
	no_lanes: 'no_lanes'
};

/** Spacings closer than this (inches) are the same spacing. */
const SPACING_TOLERANCE_IN = 0.01;
/** Overhang below this (feet, ≈ 1/8 in) is rounding, not a neighbour run over. */
const OVERHANG_TOLERANCE_FT = 0.01;

/** Units of one pass sharing one problem over one lane. */
interface UnitGroup {
	problem: CheckProblem;
	severity: 'stop' | 'warn';
	laneIndex: number | null;
	units: number[];
	message: (units: number[]) => string;
}

type CheckablePass = Pick<PlannedPass, 'number' | 'startsAt' | 'leftEdgeFt' | 'rightEdgeFt' | 'units'> & Partial<Pick<PlannedPass, 'sameEndAsPrevious'>>;

/**
 * Checks planned (or hand-edited) passes against the lanes and the planter's plumbing, and returns
 * every problem with the lane and row units it concerns, 'stop' before 'warn':
 * - stop: a fertilizer line on over a crop not in its `forCrops` (nitrogen on soybean rows);
 *   a seed box over a lane of another crop; a unit planting into a pasture or buffer lane;
 *   planter row spacing different from the lane's (a whole multiple, e.g. 30-in units on 60-in
 *   rows, is only a 'warn': every other unit plants).
 * - warn: the planter reaching onto a neighbouring lane (inches, with `equipmentFit`'s centred
 *   figure); a lane that is not a whole number of planter widths (`equipmentFit`); a pass that
 *   must start from the same end as the one before (drive back empty); rows no pass plants.
 *
 * @param passes from {@link planPasses} or edited by hand
 * @param lanes the plan's lanes (best: `plan.lanes`, which carry the pattern's row spacing)
 * @param planter the planter as set up
 * @throws EquipmentError('no-row-units') for a planter without row units, rather than an empty list
 * @example checkPasses(plan.passes, plan.lanes, planter).filter((c) => c.severity === 'stop')
 */
export function checkPasses(passes: readonly CheckablePass[], lanes: readonly (LaneInput | PlanLane)[], planter: PlanterSetup): EquipmentCheck[] {
	const checked = checkPlanter(planter);
	const planLanes = resolveLanes(lanes);
	const byIndex = new Map(planLanes.map((l) => [l.index, l]));
	const checks: EquipmentCheck[] = [];
	const add = (c: Omit<EquipmentCheck, 'kind' | 'unit'>) => checks.push({ ...c, kind: KIND_OF[c.problem], unit: c.units[0] ?? null });

	if (!planLanes.some((l) => isPlantingLane(l.kind) && l.rowPositionsIn.length > 0)) {
		add({ severity: 'stop', problem: 'no_lanes', message: 'No crop or cover lane with rows lies in this field, so there is nothing for the planter to plant. Check the plan\'s pattern.', laneIndex: null, passNumber: null, units: [] });
		return checks;
	}

	for (const pass of passes) {
		const from = `Pass ${pass.number} (from ${pass.startsAt})`;
		// Group units by lane and problem so one check names "row units 9–16", not eight checks.
		const groups = new Map<string, UnitGroup>();
		const note = (key: string, unit: PassUnit, g: Omit<UnitGroup, 'units'>) => {
			const existing = groups.get(key);
			if (existing) existing.units.push(unit.unit);
			else groups.set(key, { ...g, units: [unit.unit] });
		};
		for (const unit of pass.units) {
			const lane = unit.laneIndex === null ? undefined : byIndex.get(unit.laneIndex);
			for (const id of unit.fertilizerOn) {
				const line = checked.lines.get(id);
				if (!line || !lane || line.forCrops.some((c) => sameCrop(c, lane.crop))) continue;
				note(`fert|${lane.index}|${id}`, unit, {
					problem: 'fertilizer_wrong_crop', laneIndex: lane.index, severity: 'stop',
					message: (u) => `${from}: ${line.name} is on at ${unitList(u)} over ${laneLabel(lane)}, but that line is meant for ${line.forCrops.join(' and ') || 'no crop'}. Turn it off at ${u.length > 1 ? 'those units' : 'that unit'} or re-plumb the line.`
				});
			}
			if (!unit.on || !unit.seed) continue;
			const seed = unit.seed;
			if (!lane) {
				note('outside', unit, { problem: 'unit_on_outside_lanes', laneIndex: null, severity: 'warn', message: (u) => `${from}: ${unitList(u)} ${u.length > 1 ? 'plant' : 'plants'} ${seed.crop} outside every lane of the plan. Shut ${u.length > 1 ? 'them' : 'it'} off there.` });
			} else if (!isPlantingLane(lane.kind)) {
				note(`nonplant|${lane.index}`, unit, { problem: 'seed_in_non_crop_lane', laneIndex: lane.index, severity: 'stop', message: (u) => `${from}: ${unitList(u)} would plant ${seed.crop} into ${laneLabel(lane)}. Shut ${u.length > 1 ? 'them' : 'it'} off over that lane.` });
			} else if (!sameCrop(seed.crop, lane.crop)) {
				note(`seed|${lane.index}|${seed.crop}`, unit, { problem: 'seed_wrong_crop', laneIndex: lane.index, severity: 'stop', message: (u) => `${from}: ${unitList(u)} ${u.length > 1 ? 'carry' : 'carries'} ${seed.crop} but ${u.length > 1 ? 'run' : 'runs'} over ${laneLabel(lane)}. Start this pass from ${pass.startsAt === 'A' ? 'B' : 'A'} or change the seed boxes.` });
			}
		}
		for (const g of groups.values()) add({ severity: g.severity, problem: g.problem, message: g.message(g.units), laneIndex: g.laneIndex, passNumber: pass.number, units: g.units });

		addOverhangChecks(pass, planLanes, checked.widthFt, add);
		if (pass.sameEndAsPrevious) {
			add({ severity: 'warn', problem: 'drive_back_empty', message: driveBackEmptyMessage(pass), laneIndex: null, passNumber: pass.number, units: [] });
		}
	}

	// One sweep: which passes plant each lane, and which of its rows.
	const plantedBy = new Map<number, { passes: CheckablePass[]; rows: Set<number> }>();
	for (const pass of passes) {
		for (const u of pass.units) {
			if (!u.on || u.laneIndex === null) continue;
			const entry = plantedBy.get(u.laneIndex) ?? { passes: [], rows: new Set<number>() };
			if (entry.passes[entry.passes.length - 1] !== pass) entry.passes.push(pass);
			if (u.rowNumber !== null) entry.rows.add(u.rowNumber);
			plantedBy.set(u.laneIndex, entry);
		}
	}
	for (const lane of planLanes) {
		if (!isPlantingLane(lane.kind) || lane.rowPositionsIn.length === 0) continue;
		addSpacingCheck(lane, checked.rowSpacingIn, add);
		const planted = plantedBy.get(lane.index)?.rows ?? new Set<number>();
		addPartialPassCheck(lane, plantedBy.get(lane.index)?.passes ?? [], byIndex, checked.widthFt, add);
		const missing = lane.rowPositionsIn.map((_, i) => i + 1).filter((r) => !planted.has(r));
		if (missing.length > 0) {
			const carried = checked.units.some((u) => u.seed && sameCrop(u.seed.crop, lane.crop));
			add({
				severity: 'warn', problem: 'rows_not_planted', laneIndex: lane.index, passNumber: null, units: [],
				message: `${capital(laneLabel(lane))}: ${missing.length} of ${lane.rowPositionsIn.length} rows are not planted by these passes${carried ? '' : `; no row unit carries ${lane.crop}`}.`
			});
		}
	}
	return checks.sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'stop' ? -1 : 1));
}

/** The planter reaching onto lanes this pass does not plant; `equipmentFit` gives the centred figure. */
function addOverhangChecks(pass: CheckablePass, lanes: PlanLane[], planterWidthFt: number, add: (c: Omit<EquipmentCheck, 'kind' | 'unit'>) => void): void {
	const planting = new Set(pass.units.filter((u) => u.on && u.laneIndex !== null).map((u) => u.laneIndex as number));
	if (planting.size === 0) return;
	const groupWidthFt = lanes.filter((l) => planting.has(l.index)).reduce((s, l) => s + l.widthFt, 0);
	const centred = equipmentFit(groupWidthFt, planterWidthFt);
	for (const lane of lanes) {
		if (planting.has(lane.index)) continue;
		const reachFt = Math.min(pass.rightEdgeFt, lane.offsetFt + lane.widthFt) - Math.max(pass.leftEdgeFt, lane.offsetFt);
		if (reachFt <= OVERHANG_TOLERANCE_FT) continue;
		const units = pass.units.filter((u) => u.laneIndex === lane.index).map((u) => u.unit);
		const overhangIn = reachFt * 12;
		const centredNote = centred.overlapInEachSide > 0 ? ` Centred on ${planting.size === 1 ? 'that lane' : 'those lanes'} it would reach ${inches(centred.overlapInEachSide)} onto each side.` : '';
		add({
			severity: 'warn', problem: 'overhang', laneIndex: lane.index, passNumber: pass.number, units, overhangIn,
			message: `Pass ${pass.number} (from ${pass.startsAt}): the ${feetWide(planterWidthFt)} planter reaches ${inches(overhangIn)} onto ${laneLabel(lane)}${units.length ? `, where ${unitList(units)} run shut off` : ''}.${centredNote}`
		});
	}
}

function addSpacingCheck(lane: PlanLane, planterSpacingIn: number, add: (c: Omit<EquipmentCheck, 'kind' | 'unit'>) => void): void {
	if (lane.rowSpacingIn === null || Math.abs(lane.rowSpacingIn - planterSpacingIn) <= SPACING_TOLERANCE_IN) return;
	const ratio = lane.rowSpacingIn / planterSpacingIn;
	const multiple = Math.round(ratio) >= 2 && Math.abs(ratio - Math.round(ratio)) * planterSpacingIn <= SPACING_TOLERANCE_IN;
	const base = `Planter rows are ${formatIn(planterSpacingIn)} apart; lane ${lane.index + 1} is laid out for ${formatIn(lane.rowSpacingIn).replace(' ', '-')} rows`;
	add({
		severity: multiple ? 'warn' : 'stop', problem: 'spacing_mismatch', laneIndex: lane.index, passNumber: null, units: [],
		message: multiple
			? `${base}: only every ${ordinal(Math.round(ratio))} row unit runs on a row; shut the others off.`
			: `${base}. The row units will not run on the lane's rows: use a planter set to ${formatIn(lane.rowSpacingIn)} or change the lane.`
	});
}

/** A lane whose planting group is not a whole number of planter widths (NRCS 332: strips a multiple of equipment width). */
function addPartialPassCheck(lane: PlanLane, planting: readonly CheckablePass[], byIndex: Map<number, PlanLane>, planterWidthFt: number, add: (c: Omit<EquipmentCheck, 'kind' | 'unit'>) => void): void {
	if (planting.length === 0) return;
	const group = new Set(planting.flatMap((p) => p.units.filter((u) => u.on && u.laneIndex !== null).map((u) => u.laneIndex as number)));
	const groupWidthFt = [...group].reduce((s, i) => s + (byIndex.get(i)?.widthFt ?? 0), 0);
	const fit = equipmentFit(groupWidthFt, planterWidthFt);
	if (fit.fits) return;
	const offNotes = planting
		.map((p) => ({ n: p.number, off: p.units.filter((u) => !u.on).map((u) => u.unit) }))
		.filter((p) => p.off.length > 0)
		.map((p) => `pass ${p.n} runs with ${unitList(p.off)} shut off`);
	const what = group.size === 1 ? `${capital(laneLabel(lane))} is ${feet(lane.widthFt)} wide` : `${capital(laneLabel(lane))} is planted with lanes ${[...group].sort((a, b) => a - b).map((i) => i + 1).join(', ')} (${feet(groupWidthFt)} together)`;
	add({
		severity: 'warn', problem: 'partial_pass', laneIndex: lane.index, passNumber: planting[0].number,
		units: [...new Set(planting.flatMap((p) => p.units.filter((u) => !u.on).map((u) => u.unit)))].sort((a, b) => a - b),
		message: `${what}, not a whole number of ${feetWide(planterWidthFt)} planter widths (${fit.passes} pass${fit.passes === 1 ? '' : 'es'}, the last covering ${Math.round(fit.lastPassCoverage * 100)} %)${offNotes.length ? `: ${offNotes.join('; ')}` : ''}.`
	});
}

function formatIn(value: number): string {
	return `${Math.round(value * 100) / 100} in`;
}

function ordinal(n: number): string {
	return n === 2 ? 'other' : n === 3 ? 'third' : `${n}th`;
}

function capital(s: string): string {
	return s.charAt(0).toUpperCase() + s.slice(1);
}

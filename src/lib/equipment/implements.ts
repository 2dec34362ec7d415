import { equipmentFit, type LaneKind } from '../geometry/index';
import { EquipmentError } from './errors';
import type { LaneInput, PlanLane } from './lanes';
import { EQUIPMENT_KIND_LABELS, type CheckFinding, type Equipment, type EquipmentKind } from './types';
import { feet, feetWide, inches, laneLabel } from './words';

/** An implement as the fit check needs it; an `Equipment` record fits as is. */
export type ImplementInput = Pick<Equipment, 'name' | 'kind' | 'workingWidthFt'> & Partial<Pick<Equipment, 'id'>>;

/**
 * Lane kinds each implement works in. Buffer lanes get none: NRCS practice standard 332 says buffer
 * strips are not equipment travel lanes. Override per call where a farm works differently.
 */
export const IMPLEMENT_LANE_KINDS: Readonly<Record<EquipmentKind, readonly LaneKind[]>> = Object.freeze({
	planter: ['crop', 'cover'],
	drill: ['crop', 'cover', 'pasture'],
	sprayer: ['crop', 'cover', 'pasture'],
	sidedress: ['crop'],
	combine_head: ['crop'],
	shelter: ['pasture']
});

/** How one implement covers one lane. */
export interface ImplementLaneFit {
	laneIndex: number;
	laneKind: LaneKind;
	crop: string;
	laneWidthFt: number;
	passes: number;
	fits: boolean;
	/** How far the implement, centred on a narrower lane, reaches onto each neighbour, inches. */
	overhangEachSideIn: number;
	/** Share (0–1) of the last pass's width that lands on this lane. */
	lastPassCoverage: number;
	severity: 'ok' | 'warn';
	message: string;
}

export interface ImplementFitReport {
	implement: { id: string | null; name: string; kind: EquipmentKind; workingWidthFt: number };
	lanes: ImplementLaneFit[];
	fitsEveryLane: boolean;
}

/**
 * For each implement, how it covers every lane it works in (`IMPLEMENT_LANE_KINDS`): passes,
 * whether it fits, overhang each side (in) and last-pass coverage, all from `equipmentFit`
 * (NRCS practice standard 332: strip width a whole multiple of the equipment width).
 *
 * @param lanes the plan's lanes (a `Lane` from the layout fits)
 * @param implementsList drills, sprayers, side-dress toolbars, combine heads, shelters (widths in ft)
 * @param options `laneKinds` overrides which lane kinds an implement kind is checked against
 * @throws EquipmentError('invalid-width') for an implement whose width is not more than zero
 * @example implementChecks(lanes, [{ name: 'Drill', kind: 'drill', workingWidthFt: 15 }])[0].lanes[0].overhangEachSideIn // 30 on a 10-ft lane
 */
export function implementChecks(
	lanes: readonly (LaneInput | PlanLane)[],
	implementsList: readonly ImplementInput[],
	options: { laneKinds?: Partial<Record<EquipmentKind, readonly LaneKind[]>> } = {}
): ImplementFitReport[] {
	return implementsList.map((tool) => {
		const width = tool.workingWidthFt;
		if (typeof width !== 'number' || !Number.isFinite(width) || width <= 0) {
			throw new EquipmentError('invalid-width', `${tool.name || 'The implement'} has a working width of ${String(width)} ft; enter a width of more than zero feet.`);
		}
		const kinds = options.laneKinds?.[tool.kind] ?? IMPLEMENT_LANE_KINDS[tool.kind] ?? [];
		const what = `${feetWide(width)} ${(EQUIPMENT_KIND_LABELS[tool.kind] ?? 'implement').toLowerCase()}`;
		const fitsList = [...lanes]
			.filter((lane) => kinds.includes(lane.kind))
			.sort((a, b) => a.index - b.index)
			.map((lane): ImplementLaneFit => {
				const fit = equipmentFit(lane.widthFt, width);
				const where = `${laneLabel(lane).replace(/^l/, 'L')}, ${feet(lane.widthFt)}`;
				let message: string;
				if (fit.overlapInEachSide > 0) {
					message = `${where}: the ${what} is wider than the lane; centred, it reaches ${inches(fit.overlapInEachSide)} onto each neighbouring lane.`;
				} else if (!fit.fits) {
					message = `${where}: ${fit.passes} passes of the ${what}; the last covers ${Math.round(fit.lastPassCoverage * 100)} % of its width, so it overlaps the pass before it.`;
				} else {
					message = `${where}: ${fit.passes} pass${fit.passes === 1 ? '' : 'es'} of the ${what}, no overlap.`;
				}
				return {
					laneIndex: lane.index,
					laneKind: lane.kind,
					crop: lane.crop,
					laneWidthFt: lane.widthFt,
					passes: fit.passes,
					fits: fit.fits,
					overhangEachSideIn: fit.overlapInEachSide,
					lastPassCoverage: fit.lastPassCoverage,
					severity: fit.fits ? 'ok' : 'warn',
					message
				};
			});
		return {
			implement: { id: tool.id ?? null, name: tool.name, kind: tool.kind, workingWidthFt: width },
			lanes: fitsList,
			fitsEveryLane: fitsList.every((f) => f.fits)
		};
	});
}

/**
 * The implement fits that need attention, as findings ('warn'), named by implement.
 *
 * @example implementFitChecks(implementChecks(lanes, [drill])) // [{ severity: 'warn', kind: 'overhang', … }]
 */
export function implementFitChecks(reports: readonly ImplementFitReport[]): CheckFinding[] {
	return reports.flatMap((r) =>
		r.lanes
			.filter((f) => !f.fits)
			.map((f): CheckFinding => ({
				severity: 'warn',
				kind: f.overhangEachSideIn > 0 ? 'overhang' : 'partial_pass',
				message: `${r.implement.name}: ${f.message}`,
				laneIndex: f.laneIndex,
				unit: null
			}))
	);
}

import { EquipmentError } from './errors';
import type { FertilizerLine, PlanterSetup, RowUnit } from './types';

/** Which end of the field a pass starts from; a pass from A is driven A→B. */
export type FieldEnd = 'A' | 'B';

/** A planter checked once, with its units in number order and its working width. */
export interface CheckedPlanter {
	rowSpacingIn: number;
	units: RowUnit[];
	lines: Map<string, FertilizerLine>;
	widthFt: number;
}

/**
 * Validates a planter and returns its units in number order with its working width
 * (units × row spacing). Refuses a planter that would give a sheet that only looks valid.
 *
 * @throws EquipmentError 'no-row-units', 'invalid-row-spacing', 'unit-numbering', 'unknown-fertilizer-line'
 * @example checkPlanter({ rowSpacingIn: 30, rowUnits: sixteenUnits, fertilizerLines: [] }).widthFt // 40
 */
export function checkPlanter(planter: PlanterSetup): CheckedPlanter {
	if (!planter || !Array.isArray(planter.rowUnits) || planter.rowUnits.length === 0) {
		throw new EquipmentError('no-row-units', 'The planter has no row units set up. Add its row units (what each seed box carries) before planning passes.');
	}
	const spacing = planter.rowSpacingIn;
	if (typeof spacing !== 'number' || !Number.isFinite(spacing) || spacing <= 0) {
		throw new EquipmentError('invalid-row-spacing', `The planter's row spacing must be more than zero inches, got ${String(spacing)}.`);
	}
	const units = [...planter.rowUnits].sort((a, b) => a.unit - b.unit);
	units.forEach((u, i) => {
		if (u.unit !== i + 1) {
			throw new EquipmentError('unit-numbering', `Row units must be numbered 1 to ${units.length} from the operator's left with none missing or repeated; found ${units.map((x) => x.unit).join(', ')}.`);
		}
	});
	const lines = new Map<string, FertilizerLine>();
	for (const line of planter.fertilizerLines ?? []) lines.set(line.id, line);
	for (const u of units) {
		for (const id of u.fertilizerOn ?? []) {
			if (!lines.has(id)) {
				throw new EquipmentError('unknown-fertilizer-line', `Row unit ${u.unit} has fertilizer line "${id}" turned on, but the planter has no such line. Add the line or turn it off at that unit.`);
			}
		}
	}
	return { rowSpacingIn: spacing, units, lines, widthFt: (units.length * spacing) / 12 };
}

/**
 * Distance of a row unit from the field-left edge of the planter, feet. Units are numbered from
 * the operator's left; driving B→A the operator's left is the field's right, so unit 1 lands at
 * the far (right) side of the planter's footprint.
 *
 * @example unitOffsetFt(1, 16, 30, 'A') // 1.25; unitOffsetFt(1, 16, 30, 'B') // 38.75
 */
export function unitOffsetFt(unit: number, unitCount: number, rowSpacingIn: number, startsAt: FieldEnd): number {
	const fromOperatorLeftFt = ((unit - 0.5) * rowSpacingIn) / 12;
	return startsAt === 'A' ? fromOperatorLeftFt : (unitCount * rowSpacingIn) / 12 - fromOperatorLeftFt;
}

/** "corn — hybrid A", "soybean", or null for an empty box. */
export function seedLabel(seed: RowUnit['seed']): string | null {
	if (!seed) return null;
	return seed.variety ? `${seed.crop} — ${seed.variety}` : seed.crop;
}

// The sheet's own wording of what the equipment module computed: passes, checks and amounts as
// the cab sheet prints them. Equipment computes; the sheet formats.
import type { SheetCheck, SheetPass, SheetQuantity } from './types';
import { checkPlanter, formatNumber, seedLabel, type EquipmentCheck, type FieldQuantities, type PlannedPass, type PlanterSetup, type VarietyQuantity } from '../equipment/index';

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

/**
 * Checks as the seeding sheet stores them: the finding without the pass and unit list.
 *
 * @example toSheetChecks(checkPasses(plan.passes, plan.lanes, planter))
 */
export function toSheetChecks(checks: readonly EquipmentCheck[]): SheetCheck[] {
	return checks.map((c) => ({ severity: c.severity, kind: c.kind, message: c.message, laneIndex: c.laneIndex, unit: c.unit }));
}

/** A seed line whose seeds per unit may come from the farm's seed catalogue. */
export type SheetVariety = Omit<VarietyQuantity, 'seedsPerUnitBasis'> & { seedsPerUnitBasis: VarietyQuantity['seedsPerUnitBasis'] | 'seed catalogue' };

/**
 * The amounts as the seeding sheet prints them.
 *
 * @example toSheetQuantities(q)[0] // { label: 'Corn — hybrid A', amount: '34.0 units (2,720,000 seeds)', detail: '…' }
 */
export function toSheetQuantities(q: Omit<FieldQuantities, 'varieties'> & { varieties: readonly SheetVariety[] }): SheetQuantity[] {
	const seed = toSheetSeedQuantities(q.varieties);
	const fert = q.fertilizer.map((f): SheetQuantity => {
		const n = f.poundsN === null ? '' : ` · ${formatNumber(f.poundsN, 1)} lb N`;
		const analysis = f.poundsNPerAcre === null ? 'no analysis entered' : `${formatNumber(f.poundsPerGallon ?? 0, 2)} lb/gal (${f.densityBasis}) × ${formatNumber(f.percentN ?? 0)} % N = ${formatNumber(f.poundsNPerAcre, 2)} lb N/ac`;
		return {
			// A line named after its product ("Nitrogen (UAN 32 %)") is not named twice.
			label: f.product && !f.lineName.toLowerCase().includes(f.product.toLowerCase()) ? `${f.product} (${f.lineName})` : f.lineName,
			amount: `${formatNumber(f.gallons, 1)} gal${n}`,
			detail: `${formatNumber(f.gallonsPerAcre, 1)} gal/ac (entered) × ${formatNumber(f.acres, 2)} ac where the line is on; ${analysis}.`
		};
	});
	return [...seed, ...fert];
}

/** Seed lines of the sheet (also used alone when the farm has no planter). */
export function toSheetSeedQuantities(varieties: readonly SheetVariety[]): SheetQuantity[] {
	return varieties.map((v): SheetQuantity => {
		const label = `${v.crop.charAt(0).toUpperCase()}${v.crop.slice(1)} — ${v.variety ?? 'variety not set'}`;
		const seeds = `${formatNumber(Math.round(v.seeds))} seeds`;
		if (v.unitsExact === null || v.seedsPerUnit === null) return { label, amount: seeds, detail: `${formatNumber(v.acres, 2)} ac; no seeds-per-unit figure entered for ${v.crop}.` };
		const bags = v.unitsPerBag === 1 ? '' : `; ${formatNumber(v.bags ?? 0)} bags of ${formatNumber(v.unitsPerBag)} units`;
		return {
			label,
			amount: `${formatNumber(v.unitsExact, 1)} units (${seeds})`,
			detail: `${formatNumber(v.acres, 2)} ac × ${formatNumber(Math.round(v.averageSeedsPerAcre))} seeds/ac (entered) ÷ ${formatNumber(v.seedsPerUnit)} seeds per unit (${v.seedsPerUnitBasis}); ${formatNumber(v.unitsWhole ?? 0)} whole units${bags}.`
		};
	});
}

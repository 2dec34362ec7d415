// Assembles the cab seeding sheet from a plan and the farm's equipment. Pure: the page and the
// PDF both draw what this returns.
import type { MultiPolygon, Polygon } from 'geojson';
import type { Lane, LaneSpec, LngLat } from '../geometry/index';
import type { Equipment } from '../equipment/types';
import type { LaneAssignment } from '../plans/types';
import type { SheetCheck, SheetData, SheetQuantity } from './types';
import {
	checkPasses,
	EquipmentError,
	implementChecks,
	implementFitChecks,
	planPasses,
	seedAndFertilizerQuantities,
	seedQuantities,
	type LineRate
} from '../equipment/index';
import { toSheetChecks, toSheetPasses, toSheetQuantities, toSheetSeedQuantities, type SheetVariety } from './passes';
import { fitGroups, sheetCheckGroups } from './condensed';
import { compactNumbers, condenseFindings } from '../farm/condense';
import { withCatalogueUnits, type CatalogueVariety } from '../catalog/variety-check';
import type { VarietyQuantity } from '../equipment/index';

export const SHEET_CAUTIONS = [
	'The label is the law: read and follow every seed-treatment, fertilizer and pesticide label, including restricted-entry and grazing intervals. Rates on this sheet are what the farm entered; they are not recommendations.',
	'Anhydrous ammonia and other fertilizers: wear the protective equipment the label and SDS require, keep emergency water on the rig, and follow local rules and licensed practice.',
	'Check row units, fertilizer lines and seed boxes against this sheet before the first pass. Shut down the tractor and relieve hydraulic pressure before reaching into the planter.',
	'Watch for people, livestock and mobile shelters on pasture lanes; keep guards in place and never step over a turning shaft.'
];

export interface SheetSource {
	farmName: string;
	fieldName: string;
	preparedBy: string;
	printedAt: Date;
	plan: {
		season: number;
		variant: string;
		guidance: { a: LngLat; b: LngLat };
		pattern: LaneSpec[];
		headlandFt: number;
		fieldAcres: number;
		plantedAcres: number;
		lanes: (Lane & { assignment: LaneAssignment | null })[];
		assignments: LaneAssignment[];
	};
	outline: { boundary: Polygon | MultiPolygon; exclusions: { name: string; kind: string; geometry: Polygon | MultiPolygon }[] };
	planter: Equipment | null;
	otherImplements: Equipment[];
	/** The farm's seed catalogue: its seeds per unit replace the per-crop preset, as on the plan page. */
	catalogue?: readonly CatalogueVariety[];
}

export class SheetError extends Error {}

function hazards(src: SheetSource): string[] {
	const out = src.outline.exclusions.map((x, i) => `No-plant area: ${x.name || `exclusion ${i + 1}`} (${x.kind}). Lift the planter across it.`);
	const pasture = src.plan.lanes.filter((l) => l.kind === 'pasture').map((l) => l.index + 1);
	if (pasture.length) {
		const list = `${compactNumbers(pasture)}${pasture.length > 6 ? ` (${pasture.length} lanes)` : ''}`;
		out.push(`Animals and mobile shelters may be on pasture lanes ${list}: look before each pass and keep to the crop lanes.`);
	}
	if (src.plan.headlandFt > 0) out.push(`Headland: ${src.plan.headlandFt} ft inside the boundary is left for turning.`);
	return out;
}

/** Seed lines with the catalogue's seeds per unit where the variety is in it (bags follow). */
function catalogued(src: SheetSource, varieties: readonly VarietyQuantity[]): SheetVariety[] {
	if (!src.catalogue?.length) return [...varieties];
	return withCatalogueUnits(varieties, src.catalogue).map(({ fromCatalogue, ...v }, i) =>
		fromCatalogue && v.seedsPerUnit !== null && v.seedsPerUnit !== varieties[i].seedsPerUnit && v.unitsExact !== null
			? { ...v, seedsPerUnitBasis: 'seed catalogue', bags: Math.ceil(v.unitsExact / v.unitsPerBag - 1e-9) }
			: { ...v, seedsPerUnitBasis: varieties[i].seedsPerUnitBasis }
	);
}

function seedOnlyQuantities(src: SheetSource): SheetQuantity[] {
	return toSheetSeedQuantities(catalogued(src, seedQuantities(src.plan.lanes, src.plan.assignments).varieties));
}

function listOf(items: (string | number)[], max = 10): string {
	return items.length > max ? `${items.slice(0, max).join(', ')} and ${items.length - max} more` : items.join(', ');
}

/**
 * One line per problem, not per pass: "Passes 1, 2, 5 …: nitrogen is on at row unit 9 over lanes
 * 1, 5, 13 … (soybean)" reads faster in a cab than fifteen near-identical lines.
 */
export function condenseChecks(checks: SheetCheck[]): SheetCheck[] {
	const groups = new Map<string, { first: SheetCheck; body: string; passes: number[]; lanes: number[] }>();
	checks.forEach((c, i) => {
		const m = c.message.match(/^Pass (\d+) \(from [AB]\): (.*)$/s);
		if (!m) return void groups.set(`single|${i}`, { first: c, body: c.message, passes: [], lanes: [] });
		const lane = m[2].match(/\blane (\d+)/);
		const body = m[2].replace(/\blane \d+/, 'lane #');
		const key = `${c.severity}|${c.kind}|${c.unit}|${body}`;
		const g = groups.get(key) ?? { first: c, body, passes: [], lanes: [] };
		g.passes.push(Number(m[1]));
		if (lane && !g.lanes.includes(Number(lane[1]))) g.lanes.push(Number(lane[1]));
		groups.set(key, g);
	});
	return [...groups.values()].map((g) => {
		if (g.passes.length <= 1) return g.first;
		const lanes = g.lanes.length > 1 ? `lanes ${listOf(g.lanes)}` : `lane ${g.lanes[0]}`;
		return { ...g.first, laneIndex: g.lanes.length === 1 ? g.first.laneIndex : null, message: `Passes ${listOf(g.passes)}: ${g.body.replace('lane #', lanes)}` };
	});
}

/**
 * Builds the sheet. A planter that cannot be planned (no row units, wrong spacing …) becomes a
 * STOP check with no passes, never a sheet that looks valid but is wrong.
 * @throws SheetError when the plan has no lanes
 */
export function buildSheet(src: SheetSource): SheetData {
	if (src.plan.lanes.length === 0) throw new SheetError('This plan has no lanes inside the planted area, so there is nothing to seed. Check the pattern, headland and exclusions.');
	const spacingOf = (l: Lane) => src.plan.pattern[l.patternIndex]?.rowSpacingIn ?? null;
	const data: SheetData = {
		farmName: src.farmName,
		fieldName: src.fieldName,
		season: src.plan.season,
		planName: src.plan.variant === 'main' ? 'Adopted plan' : src.plan.variant,
		printedAt: src.printedAt,
		preparedBy: src.preparedBy,
		fieldAcres: src.plan.fieldAcres,
		plantedAcres: src.plan.plantedAcres,
		guidance: src.plan.guidance,
		headlandFt: src.plan.headlandFt,
		boundary: src.outline.boundary,
		exclusions: src.outline.exclusions.map((x) => ({ name: x.name || x.kind, geometry: x.geometry })),
		lanes: src.plan.lanes.map((l) => ({
			index: l.index,
			kind: l.kind,
			crop: l.crop,
			widthFt: l.widthFt,
			rows: l.rows,
			rowSpacingIn: spacingOf(l),
			acres: l.acres,
			variety: l.assignment?.variety ?? null,
			populationPerAcre: l.assignment?.populationPerAcre ?? null,
			trialLabel: l.assignment?.trialLabel ?? null,
			geometry: l.geometry
		})),
		equipment: null,
		passes: [],
		checks: [],
		checkGroups: [],
		hazards: hazards(src),
		quantities: [],
		cautions: SHEET_CAUTIONS
	};

	const implementsToCheck = src.otherImplements.filter((e) => e.kind !== 'planter');
	const fitReports = implementsToCheck.length ? implementChecks(src.plan.lanes, implementsToCheck) : [];
	const fitChecks: SheetCheck[] = implementFitChecks(fitReports);
	const sizes = src.plan.lanes.map((l) => ({ index: l.index, acres: l.acres, widthFt: l.widthFt }));

	const planter = src.planter;
	if (!planter?.planter) {
		data.quantities = seedOnlyQuantities(src);
		data.checks = fitChecks;
		data.checkGroups = fitGroups(fitReports, sizes);
		return data;
	}
	const setup = planter.planter;
	data.equipment = {
		name: planter.name,
		widthFt: (setup.rowUnits.length * setup.rowSpacingIn) / 12,
		rowSpacingIn: setup.rowSpacingIn,
		units: setup.rowUnits.map((u) => ({
			unit: u.unit,
			seed: u.seed ? `${u.seed.crop}${u.seed.variety ? ` — ${u.seed.variety}` : ''}` : null,
			fertilizer: setup.fertilizerLines.map((line) => ({ name: line.name, on: u.fertilizerOn.includes(line.id) }))
		}))
	};
	try {
		const plan = planPasses({ lanes: src.plan.lanes, pattern: src.plan.pattern, planter: setup });
		const checks = checkPasses(plan.passes, plan.lanes, setup);
		data.passes = toSheetPasses(plan.passes, setup);
		data.checks = [...condenseChecks(toSheetChecks(checks)), ...fitChecks];
		data.checkGroups = sheetCheckGroups({ checks, passes: data.passes, lanes: sizes, fit: fitReports });
		// plan.warnings (empty returns, rows left unplanted) are among the checks already.
		const rates: Record<string, LineRate> = {};
		for (const line of setup.fertilizerLines) {
			if (line.gallonsPerAcre) {
				rates[line.id] = {
					gallonsPerAcre: line.gallonsPerAcre,
					...(line.percentN && line.poundsPerGallon ? { product: { name: line.product ?? line.name, percentN: line.percentN, poundsPerGallon: line.poundsPerGallon } } : {})
				};
			}
		}
		const quantities = seedAndFertilizerQuantities(plan.lanes, src.plan.assignments, setup, { rates, passes: plan.passes });
		data.quantities = toSheetQuantities({ ...quantities, varieties: catalogued(src, quantities.varieties) });
	} catch (e) {
		if (!(e instanceof EquipmentError)) throw e;
		data.passes = [];
		const cannot: SheetCheck = { severity: 'stop', kind: 'other', message: `${planter.name}: ${e.message}`, laneIndex: null, unit: null };
		data.checks = [cannot, ...fitChecks];
		data.checkGroups = [...condenseFindings([cannot]), ...fitGroups(fitReports, sizes)];
		data.quantities = seedOnlyQuantities(src);
	}
	// Stop-level problems first: they decide whether the planter may roll.
	data.checks.sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'stop' ? -1 : 1));
	return data;
}

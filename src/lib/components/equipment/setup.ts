// Plain helpers behind the equipment pages: the planter editor's quick fills, the live check, and
// the short facts shown in lists. No I/O; the editor and the server-rendered pages share them.
import { checkPlanter, EquipmentError, type Equipment, type EquipmentKind, type FertilizerLine, type PlanterSetup, type RowUnit } from '$lib/equipment';
import { feet, feetWide, formatNumber, unitList } from '$lib/equipment/words';

export const KIND_GROUP_LABELS: Record<EquipmentKind, string> = {
	planter: 'Planters',
	drill: 'Drills and seeders',
	sprayer: 'Sprayers',
	sidedress: 'Side-dress toolbars',
	combine_head: 'Combine heads',
	shelter: 'Mobile livestock shelters'
};

/** Kinds whose row units are set up one by one (seed boxes and fertilizer lines). */
export const hasRowUnits = (kind: string) => kind === 'planter' || kind === 'sidedress';

export const MAX_ROW_UNITS = 96;

export const RATE_CAUTION =
	'Rates here are what you enter from the label and your plan; Stripwright does arithmetic, it does not recommend a rate. The label is the law; follow local rules and licensed practice when handling anhydrous ammonia and other fertilizers.';

export function emptySetup(): PlanterSetup {
	return { rowSpacingIn: 30, rowUnits: resizeUnits([], 16), fertilizerLines: [] };
}

/** Units 1…count, keeping what the first units already carried. */
export function resizeUnits(units: RowUnit[], count: number): RowUnit[] {
	const n = Math.max(0, Math.min(MAX_ROW_UNITS, Math.floor(count) || 0));
	return Array.from({ length: n }, (_, i) => units[i] ?? { unit: i + 1, seed: null, fertilizerOn: [] });
}

/** The unit numbers from..to (1-based, inclusive) that exist on this setup, whichever way round. */
export function unitRange(units: RowUnit[], from: number, to: number): number[] {
	const lo = Math.max(1, Math.min(from, to));
	const hi = Math.min(units.length, Math.max(from, to));
	return Number.isFinite(lo) && Number.isFinite(hi) && hi >= lo ? Array.from({ length: hi - lo + 1 }, (_, i) => lo + i) : [];
}

/** Units from..to carry the crop and variety; an empty crop shuts their seed boxes off. */
export function fillSeed(units: RowUnit[], from: number, to: number, crop: string, variety: string): RowUnit[] {
	const chosen = new Set(unitRange(units, from, to));
	const seed = crop.trim() ? { crop: crop.trim(), variety: variety.trim() || null } : null;
	return units.map((u) => (chosen.has(u.unit) ? { ...u, seed: seed && { ...seed } } : u));
}

/** Turns one fertilizer line on or off for units from..to, leaving the other units as they were. */
export function fillLine(units: RowUnit[], lineId: string, from: number, to: number, on: boolean): RowUnit[] {
	const chosen = new Set(unitRange(units, from, to));
	return units.map((u) => {
		if (!chosen.has(u.unit)) return u;
		const rest = u.fertilizerOn.filter((id) => id !== lineId);
		return { ...u, fertilizerOn: on ? [...rest, lineId] : rest };
	});
}

/** A key for a new line that no existing line uses: line-1, line-2 … */
export function nextLineId(lines: FertilizerLine[]): string {
	for (let i = 1; ; i++) if (!lines.some((l) => l.id === `line-${i}`)) return `line-${i}`;
}

/** Removes a line and turns it off at every unit, so nothing points at a line that is gone. */
export function removeLine(setup: PlanterSetup, lineId: string): PlanterSetup {
	return {
		...setup,
		fertilizerLines: setup.fertilizerLines.filter((l) => l.id !== lineId),
		rowUnits: setup.rowUnits.map((u) => ({ ...u, fertilizerOn: u.fertilizerOn.filter((id) => id !== lineId) }))
	};
}

/** The setup as the server stores it; a side-dress toolbar carries no seed. */
export function setupForKind(setup: PlanterSetup, kind: string): PlanterSetup {
	return kind === 'sidedress' ? { ...setup, rowUnits: setup.rowUnits.map((u) => ({ ...u, seed: null })) } : setup;
}

export interface SetupReport {
	widthFt: number | null;
	problem: string | null;
	/** Plumbing that validates but is probably wrong: a line on over a crop it is not meant for. */
	warnings: string[];
}

/** What the editor shows live: the working width, a refusal the server would make, and warnings. */
export function reportSetup(setup: PlanterSetup, kind: string): SetupReport {
	let widthFt: number | null = null;
	try {
		widthFt = checkPlanter(setup).widthFt;
	} catch (e) {
		if (!(e instanceof EquipmentError)) throw e;
		return { widthFt: null, problem: e.message, warnings: [] };
	}
	const warnings: string[] = [];
	if (kind === 'planter') {
		for (const line of setup.fertilizerLines) {
			const meantFor = new Set(line.forCrops.map((c) => c.trim().toLowerCase()));
			const wrong = setup.rowUnits.filter((u) => u.seed && u.fertilizerOn.includes(line.id) && !meantFor.has(u.seed.crop.trim().toLowerCase()));
			if (wrong.length && meantFor.size) {
				const crops = [...new Set(wrong.map((u) => u.seed!.crop))].join(', ');
				warnings.push(`${line.name || line.id} is meant for ${line.forCrops.join(', ')} but is on at ${unitList(wrong.map((u) => u.unit))}, which ${wrong.length === 1 ? 'carries' : 'carry'} ${crops}.`);
			}
		}
	}
	return { widthFt, problem: null, warnings };
}

/** "corn — hybrid A on row units 1–6; soybean on row units 7–12; off: row unit 13". */
export function seedSummary(units: RowUnit[]): string {
	const groups = new Map<string, number[]>();
	for (const u of units) {
		const key = u.seed ? (u.seed.variety ? `${u.seed.crop} — ${u.seed.variety}` : u.seed.crop) : '';
		groups.set(key, [...(groups.get(key) ?? []), u.unit]);
	}
	const parts = [...groups].filter(([k]) => k).map(([k, list]) => `${k} on ${unitList(list)}`);
	const off = groups.get('');
	if (off) parts.push(`seed off at ${unitList(off)}`);
	return parts.join('; ');
}

/** "Nitrogen on row units 1–6", one entry per line. */
export function lineSummaries(setup: PlanterSetup): string[] {
	return setup.fertilizerLines.map((l) => {
		const on = setup.rowUnits.filter((u) => u.fertilizerOn.includes(l.id)).map((u) => u.unit);
		return `${l.name} ${on.length ? `on ${unitList(on)}` : 'off at every unit'}`;
	});
}

/** "30 in", "7.5 in": inches without needless decimals. */
export function inchesText(value: number): string {
	const r = Math.round(value * 10) / 10;
	return `${formatNumber(r, Number.isInteger(r) ? 0 : 1)} in`;
}

/** The few facts that tell implements apart in a list, units on every number. */
export function equipmentFacts(e: Equipment): string[] {
	const facts: string[] = [];
	if (e.planter) {
		facts.push(`${e.planter.rowUnits.length} row units × ${inchesText(e.planter.rowSpacingIn)}`);
		if (e.kind === 'planter') facts.push(seedSummary(e.planter.rowUnits));
		facts.push(...lineSummaries(e.planter));
	} else if (e.kind === 'sprayer') {
		facts.push(`${feetWide(e.workingWidthFt)} boom`);
		if (e.sections) facts.push(`${e.sections} boom section${e.sections === 1 ? '' : 's'}`);
	} else if (e.kind === 'combine_head') {
		if (e.rows) facts.push(`${e.rows} rows, ${inchesText((e.workingWidthFt * 12) / e.rows)} apart`);
	} else if (e.kind === 'shelter') {
		facts.push(`${feet(e.workingWidthFt)} wide × ${e.lengthFt === null ? '—' : feet(e.lengthFt)} long`);
	}
	return facts.filter(Boolean);
}

export { feet };

// What keeps the cab sheet to one sheet of paper: each kind of problem said once with what it
// costs, lanes set up alike in one row, and the pass setup most passes share written once. The
// page and the PDF both draw these; the full lists go to the appendix. Pure.
import { compactNumbers, condenseFindings, laneListWords, passesWord, type CondensedWarning } from '../farm/condense';
import type { EquipmentCheck, ImplementFitReport } from '../equipment/index';
import type { SheetCheck, SheetLane, SheetPass } from './types';

/** Up to this many lanes the sheet lists each lane; a larger field gets one row per lane setup. */
export const FULL_LANE_LIST_MAX = 24;

const FEET_PER_MILE = 5280;
const SQFT_PER_ACRE = 43_560;

interface LaneSize {
	index: number;
	acres: number;
	widthFt: number;
}

/** Length of a lane along the A-B line, from its area and width (feet). */
function laneLengthFt(lane: LaneSize): number {
	return lane.widthFt > 0 ? (lane.acres * SQFT_PER_ACRE) / lane.widthFt : 0;
}

function miles(feet: number): string {
	const mi = feet / FEET_PER_MILE;
	if (mi < 0.95) return `${(Math.round(mi * 10) / 10).toFixed(1)} mile`;
	const r = mi < 10 ? Math.round(mi * 10) / 10 : Math.round(mi);
	return `${r.toLocaleString('en-US')} mile${r === 1 ? '' : 's'}`;
}

function acresText(acres: number): string {
	return `${acres < 10 ? acres.toFixed(1) : Math.round(acres).toLocaleString('en-US')} ac`;
}

function feetText(value: number): string {
	const r = Math.round(value * 100) / 100;
	return `${r.toLocaleString('en-US')} ft`;
}

/**
 * "All 32 passes run from A: 31 empty returns, about 16 miles of driving with the planter raised."
 * One line for every pass that must start from the same end as the pass before it.
 */
export function driveBackGroup(drives: readonly Pick<EquipmentCheck, 'passNumber' | 'message'>[], passes: readonly Pick<SheetPass, 'number' | 'startsAt' | 'laneIndexes'>[], lanes: readonly LaneSize[]): CondensedWarning | null {
	if (drives.length === 0) return null;
	const byIndex = new Map(lanes.map((l) => [l.index, l]));
	const byNumber = new Map(passes.map((p) => [p.number, p]));
	const numbers = [...new Set(drives.map((d) => d.passNumber).filter((n): n is number => n !== null))].sort((a, b) => a - b);
	// The empty run back is as long as the pass just driven.
	const feet = numbers.reduce((sum, n) => {
		const before = byNumber.get(n - 1) ?? byNumber.get(n);
		const length = Math.max(0, ...(before?.laneIndexes ?? []).map((i) => laneLengthFt(byIndex.get(i) ?? { index: i, acres: 0, widthFt: 0 })));
		return sum + length;
	}, 0);
	const ends = new Set(passes.map((p) => p.startsAt));
	const end = passes[0]?.startsAt ?? 'A';
	const other = end === 'A' ? 'B' : 'A';
	const returns = `${numbers.length} empty return${numbers.length === 1 ? '' : 's'}`;
	const cost = feet > 0 ? `, about ${miles(feet)} driven with the planter raised` : '';
	const summary =
		ends.size === 1 && numbers.length === passes.length - 1 && passes.length > 1
			? `All ${passesWord(passes.length)} run from ${end}: ${returns}${cost} (from ${other}, seed boxes would run over the wrong crop).`
			: `${numbers.length === 1 ? `Pass ${numbers[0]} starts` : `${passesWord(numbers.length)} (${compactNumbers(numbers)}) start`} from the same end as the pass before: ${returns}${cost} (from the other end, seed boxes would run over the wrong crop).`;
	return { kind: 'drive_back_empty', severity: 'warn', summary, details: drives.map((d) => d.message), laneNumbers: [] };
}

/**
 * Implements that do not fit lanes, one line per implement (each kind of misfit in turn), with what it
 * costs: ground covered twice (a last pass overlapping the one before) or neighbouring lanes
 * reached (an implement wider than the lane).
 */
export function fitGroups(reports: readonly ImplementFitReport[], lanes: readonly LaneSize[]): CondensedWarning[] {
	const byIndex = new Map(lanes.map((l) => [l.index, l]));
	const out: CondensedWarning[] = [];
	for (const r of reports) {
		const groups = new Map<string, ImplementFitReport['lanes']>();
		for (const f of r.lanes.filter((x) => !x.fits)) {
			const key = `${Math.round(f.laneWidthFt * 100)}|${f.passes}|${Math.round(f.overhangEachSideIn)}|${Math.round(f.lastPassCoverage * 100)}`;
			groups.set(key, [...(groups.get(key) ?? []), f]);
		}
		const mine: CondensedWarning[] = [];
		for (const list of groups.values()) {
			const f = list[0];
			const overhang = f.overhangEachSideIn > 0;
			const acres = list.reduce((sum, x) => {
				const lane = byIndex.get(x.laneIndex);
				if (!lane || !(x.laneWidthFt > 0)) return sum;
				const extraFt = overhang ? (2 * x.overhangEachSideIn) / 12 : x.passes * r.implement.workingWidthFt - x.laneWidthFt;
				return sum + (lane.acres * extraFt) / x.laneWidthFt;
			}, 0);
			const where = `${r.implement.name}: ${laneListWords(list.map((x) => x.laneIndex + 1))}, ${feetText(f.laneWidthFt)}${list.length > 1 ? ' each' : ''}`;
			const summary = overhang
				? `${where}: wider than the lane, it reaches ${Math.round(f.overhangEachSideIn)} in onto each neighbour; about ${acresText(acres)} of neighbouring lanes under it in all.`
				: `${where}: ${f.passes} passes a lane, the last overlapping the one before (it covers ${Math.round(f.lastPassCoverage * 100)} % of its width); about ${acresText(acres)} covered twice.`;
			const details = list.map((x) => `${r.implement.name}: ${x.message}`);
			mine.push({ kind: overhang ? 'overhang' : 'partial_pass', severity: 'warn', summary, details, laneNumbers: list.map((x) => x.laneIndex + 1) });
		}
		// One line per implement: its misfits on lanes of different widths follow one another.
		if (mine.length > 0) {
			const prefix = `${r.implement.name}: `;
			out.push({
				...mine[0],
				summary: `${prefix}${mine.map((g) => g.summary.slice(prefix.length).replace(/\.$/, '')).join('; ')}.`,
				details: mine.flatMap((g) => g.details),
				laneNumbers: [...new Set(mine.flatMap((g) => g.laneNumbers))].sort((a, b) => a - b)
			});
		}
	}
	return out;
}

/** A kind of planter finding in a few words, for the line that stands for many (condenseFindings). */
export const SHEET_PROBLEM_WORDS: Record<string, string> = {
	overhang: 'the planter reaches onto a lane it does not plant, with the row units over it shut off; see the appendix for how far on each pass',
	partial_pass: 'a lane (or lanes planted together) is not a whole number of planter widths, so some passes run with row units shut off',
	rows_not_planted: 'rows that no pass plants',
	unit_on_outside_lanes: 'row units planting outside every lane; shut them off there',
	spacing_mismatch: 'the planter row spacing differs from the lane\'s; shut off the units that miss a row'
};

/**
 * The sheet's problems, one line per kind, STOP first: the planter checks, the empty returns and
 * the other implements' fit. `other` are findings made elsewhere (a planter that cannot be planned).
 */
export function sheetCheckGroups(input: {
	checks: readonly EquipmentCheck[];
	passes: readonly SheetPass[];
	lanes: readonly LaneSize[];
	fit: readonly ImplementFitReport[];
	other?: readonly SheetCheck[];
}): CondensedWarning[] {
	const drives = input.checks.filter((c) => c.problem === 'drive_back_empty');
	const rest = input.checks.filter((c) => c.problem !== 'drive_back_empty');
	const findings = [...(input.other ?? []), ...rest].map((c) => ({ kind: 'problem' in c ? (c as EquipmentCheck).problem : c.kind, laneIndex: c.laneIndex, message: c.message, severity: c.severity }));
	const planter = condenseFindings(findings, { words: SHEET_PROBLEM_WORDS });
	const drive = driveBackGroup(drives, input.passes, input.lanes);
	const all = [...planter.filter((g) => g.severity === 'stop'), ...planter.filter((g) => g.severity !== 'stop'), ...(drive ? [drive] : []), ...fitGroups(input.fit, input.lanes)];
	return all;
}

/** The sheet's lines per kind of problem: the builder's, or `checks` condensed when it gave none. */
export function checkGroupsOf(sheet: { checks: readonly SheetCheck[]; checkGroups?: CondensedWarning[] }): CondensedWarning[] {
	return sheet.checkGroups ?? condenseFindings(sheet.checks.map((c) => ({ kind: c.kind, laneIndex: c.laneIndex, message: c.message, severity: c.severity })));
}

/**
 * What a pass does, without the lane numbers the pass list already shows:
 * "Lanes 1–2: units 1–8 corn (hybrid A) on lane 1, units 9–16 soybean on lane 2" →
 * "units 1–8 corn (hybrid A), units 9–16 soybean".
 */
export function passSetup(summary: string): string {
	return summary.replace(/^Lanes? [\d,\s–-]+:\s*/, '').replace(/ on lane \d+/g, '');
}

/** The setup most passes share (when at least two do), written once above the pass list. */
export function usualSetup(passes: readonly Pick<SheetPass, 'summary'>[]): string | null {
	const counts = new Map<string, number>();
	for (const p of passes) counts.set(passSetup(p.summary), (counts.get(passSetup(p.summary)) ?? 0) + 1);
	let best: [string, number] | null = null;
	for (const entry of counts) if (!best || entry[1] > best[1]) best = entry;
	return best && best[1] >= 2 ? best[0] : null;
}

/** A lane's setup with its lanes' numbers; `acres` is of all the lanes together. */
export interface LaneGroup extends Omit<SheetLane, 'index' | 'geometry'> {
	/** 1-based lane numbers. */
	laneNumbers: number[];
}

/** Lanes set up alike (kind, crop, width, rows, variety, population, trial) in one row, in lane order. */
export function laneGroups(lanes: readonly Omit<SheetLane, 'geometry'>[]): LaneGroup[] {
	const groups = new Map<string, LaneGroup>();
	for (const l of [...lanes].sort((a, b) => a.index - b.index)) {
		const key = JSON.stringify([l.kind, l.crop, Math.round(l.widthFt * 100), l.rows, l.rowSpacingIn, l.variety, l.populationPerAcre, l.trialLabel]);
		const g = groups.get(key);
		if (g) {
			g.laneNumbers.push(l.index + 1);
			g.acres += l.acres;
		} else {
			groups.set(key, { laneNumbers: [l.index + 1], kind: l.kind, crop: l.crop, widthFt: l.widthFt, rows: l.rows, rowSpacingIn: l.rowSpacingIn, acres: l.acres, variety: l.variety, populationPerAcre: l.populationPerAcre, trialLabel: l.trialLabel });
		}
	}
	return [...groups.values()];
}

/** "Lanes 1, 3, 5 … 63 (32)" for a group, "Lane 4" for one lane. */
export function laneGroupLabel(g: Pick<LaneGroup, 'laneNumbers'>): string {
	return g.laneNumbers.length === 1 ? `Lane ${g.laneNumbers[0]}` : `Lanes ${compactNumbers(g.laneNumbers)} (${g.laneNumbers.length})`;
}

/** `?appendix=1` (or true, yes, on) on the sheet page and sheet.pdf asks for the full lists. */
export function wantsAppendix(url: URL): boolean {
	return ['1', 'true', 'yes', 'on'].includes((url.searchParams.get('appendix') ?? '').toLowerCase());
}

/**
 * Whether a pass grid names setups by letter: when the passes use more than two setups. One
 * exception reads well as a footnote; several (a planter that does not suit the lanes) read
 * better as a letter beside each pass.
 */
export function letteredPasses(passes: readonly Pick<SheetPass, 'number' | 'summary' | 'unitsOn'>[]): boolean {
	return passSetupKeys(passes).keys.length > 2;
}

export interface PassSetupKey {
	/** "a", "b" … in order of first use. */
	letter: string;
	setup: string;
	/** The setup without its list of units off: "units 1, 3, 5 and 7 corn (hybrid A)". */
	planting: string;
	unitsOn: number;
	passes: number[];
}

/** The n-th letter: a … z, then a2 … z2 (a field needs that many setups only in theory). */
function setupLetter(n: number): string {
	return `${String.fromCharCode(97 + (n % 26))}${n >= 26 ? Math.floor(n / 26) + 1 : ''}`;
}

/**
 * Every setup the passes use, lettered in driving order, so a dense pass grid can name each
 * pass's setup in one letter and say it once in the key.
 */
export function passSetupKeys(passes: readonly Pick<SheetPass, 'number' | 'summary' | 'unitsOn'>[]): { keys: PassSetupKey[]; letterOf: Map<number, string> } {
	const byKey = new Map<string, PassSetupKey>();
	const letterOf = new Map<number, string>();
	for (const p of [...passes].sort((a, b) => a.number - b.number)) {
		const setup = passSetup(p.summary);
		const id = `${p.unitsOn}|${setup}`;
		let key = byKey.get(id);
		if (!key) {
			key = { letter: setupLetter(byKey.size), setup, planting: setup.replace(/;\s*units? [^;]* off$/, '') || setup, unitsOn: p.unitsOn, passes: [] };
			byKey.set(id, key);
		}
		key.passes.push(p.number);
		letterOf.set(p.number, key.letter);
	}
	return { keys: [...byKey.values()], letterOf };
}

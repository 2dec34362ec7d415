// Small wording helpers, so every message names lanes and row units the same way.
import type { PlanLane } from './lanes';

/** "lane 3 (soybean)": lanes are counted from 1 for people (index 0 is lane 1). */
export function laneLabel(lane: Pick<PlanLane, 'index' | 'crop' | 'kind'>): string {
	const what = lane.kind === 'crop' ? lane.crop : lane.kind === lane.crop ? lane.kind : `${lane.kind}, ${lane.crop}`;
	return `lane ${lane.index + 1} (${what})`;
}

/** "row unit 4", "row units 1–8", "row units 1–4, 9 and 12". */
export function unitList(units: readonly number[]): string {
	const sorted = [...new Set(units)].sort((a, b) => a - b);
	if (sorted.length === 0) return 'no row units';
	const parts: string[] = [];
	let start = sorted[0];
	let prev = sorted[0];
	for (const u of [...sorted.slice(1), Number.NaN]) {
		if (u === prev + 1) {
			prev = u;
			continue;
		}
		parts.push(start === prev ? `${start}` : `${start}–${prev}`);
		start = u;
		prev = u;
	}
	const joined = parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}` : parts[0];
	return `${sorted.length === 1 ? 'row unit' : 'row units'} ${joined}`;
}

/** Numbers as a US reader expects them: 2,720,000; 34.0. */
export function formatNumber(value: number, decimals = 0): string {
	return value.toLocaleString('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

/** A width in feet without needless decimals: 20 ft, 12.5 ft, 21.67 ft. */
export function feet(value: number): string {
	const r = Math.round(value * 100) / 100;
	return `${formatNumber(r, Number.isInteger(r) ? 0 : Number.isInteger(r * 10) ? 1 : 2)} ft`;
}

/** A width used as an adjective: "a 30-ft planter". */
export function feetWide(value: number): string {
	return feet(value).replace(' ', '-');
}

/** Inches rounded to whole inches: 30 in. */
export function inches(value: number): string {
	return `${formatNumber(Math.round(value))} in`;
}

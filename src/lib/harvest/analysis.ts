// A season's harvest on one field, lane by lane, and the comparisons the farmer asks of it: the edge
// effect (outside against inside rows), hybrids in a trial block, strips against the check strip, and
// the land equivalent ratio. Comparisons only ever set like beside like: the same row position, and
// for whole-lane yields the same share of border rows.
import { landEquivalentRatioFromStrips } from '../agronomy/index.js';
import { isGrainCrop, type RowPosition } from './entry.js';
import { mean, pairedDifference, welchDifference, type MeanDifference } from './stats.js';

export interface AnalysisLane {
	laneIndex: number;
	kind: string;
	crop: string;
	acres: number;
	widthFt: number;
	rows: number;
	borderRows: number;
	variety: string | null;
	trialLabel: string | null;
}

export interface AnalysisEntry {
	rowPosition: RowPosition;
	crop: string;
	bushelsPerAcre: number;
	harvestedAcres: number;
	laneIndexes: number[];
}

/** A yield monitor's mean for a lane (already at standard moisture). */
export interface MonitorLaneYield {
	laneIndex: number;
	meanBushelsPerAcre: number;
	points: number;
}

export interface LaneYield extends AnalysisLane {
	/** Area-weighted mean bu/ac of the entries at each row position. */
	byPosition: Partial<Record<RowPosition, number>>;
	entries: number;
	/** Whole-lane bu/ac: weighed whole lane, else outside and inside rows weighted by their rows, else the yield monitor. */
	laneYield: number | null;
	source: 'scale' | 'rows' | 'monitor' | null;
	isCheck: boolean;
}

export const isCheckLabel = (label: string | null) => label != null && /check/i.test(label);

export function laneYields(lanes: AnalysisLane[], entries: AnalysisEntry[], monitor: MonitorLaneYield[] = []): LaneYield[] {
	const monitorByLane = new Map(monitor.map((m) => [m.laneIndex, m]));
	return lanes.map((lane) => {
		const mine = entries.filter((e) => e.laneIndexes.includes(lane.laneIndex));
		const byPosition: Partial<Record<RowPosition, number>> = {};
		for (const position of ['all', 'outside', 'inside'] as const) {
			const at = mine.filter((e) => e.rowPosition === position);
			if (!at.length) continue;
			// Each entry's acres are shared out evenly over its lanes for the weighting.
			const weights = at.map((e) => e.harvestedAcres / e.laneIndexes.length);
			const total = weights.reduce((s, w) => s + w, 0);
			byPosition[position] = at.reduce((s, e, i) => s + e.bushelsPerAcre * weights[i], 0) / total;
		}
		let laneYield: number | null = null;
		let source: LaneYield['source'] = null;
		if (byPosition.all != null) {
			laneYield = byPosition.all;
			source = 'scale';
		} else if (byPosition.outside != null && byPosition.inside != null && lane.rows > 0) {
			laneYield = (byPosition.outside * lane.borderRows + byPosition.inside * (lane.rows - lane.borderRows)) / lane.rows;
			source = 'rows';
		} else if (monitorByLane.get(lane.laneIndex)?.points) {
			laneYield = monitorByLane.get(lane.laneIndex)!.meanBushelsPerAcre;
			source = 'monitor';
		}
		return { ...lane, byPosition, entries: mine.length, laneYield, source, isCheck: isCheckLabel(lane.trialLabel) };
	});
}

export interface EdgeEffect {
	crop: string;
	/** Lanes with both outside and inside rows weighed: the replications. */
	lanes: number;
	entries: number;
	outsideMean: number;
	insideMean: number;
	/** outside − inside, paired within each lane */
	comparison: MeanDifference;
	/** (outside − inside) ÷ inside × 100 */
	percent: number;
}

/** Outside rows against inside rows of the same lanes, per crop (paired by lane). */
export function edgeEffects(yields: LaneYield[], entries: AnalysisEntry[]): EdgeEffect[] {
	const crops = [...new Set(yields.filter((l) => l.byPosition.outside != null && l.byPosition.inside != null).map((l) => l.crop))].sort();
	return crops.map((crop) => {
		const paired = yields.filter((l) => l.crop === crop && l.byPosition.outside != null && l.byPosition.inside != null);
		const comparison = pairedDifference(paired.map((l) => ({ a: l.byPosition.outside!, b: l.byPosition.inside! })));
		const laneSet = new Set(paired.map((l) => l.laneIndex));
		return {
			crop,
			lanes: paired.length,
			entries: entries.filter((e) => e.crop === crop && e.rowPosition !== 'all' && e.laneIndexes.some((i) => laneSet.has(i))).length,
			outsideMean: comparison.meanA,
			insideMean: comparison.meanB,
			comparison,
			percent: (comparison.difference / comparison.meanB) * 100
		};
	});
}

interface Sample {
	lane: LaneYield;
	value: number;
	stratum: string;
}

const borderLabel = (l: AnalysisLane) => (l.borderRows === 0 ? 'no border rows' : `${l.borderRows} of ${l.rows} rows border rows`);

/** Lane values set into strata of like with like: the row position, and for whole lanes their border rows. */
function samples(lanes: LaneYield[]): Sample[] {
	const out: Sample[] = [];
	for (const lane of lanes) {
		if (lane.laneYield != null) out.push({ lane, value: lane.laneYield, stratum: `whole lanes, ${borderLabel(lane)}` });
		if (lane.byPosition.outside != null) out.push({ lane, value: lane.byPosition.outside, stratum: 'outside rows' });
		if (lane.byPosition.inside != null) out.push({ lane, value: lane.byPosition.inside, stratum: 'inside rows' });
	}
	return out;
}

export interface GroupComparison {
	/** what is compared: e.g. "hybrid B" or "12 rows on 60 in" */
	label: string;
	/** what it is compared against */
	against: string;
	stratum: string;
	comparison: MeanDifference;
}

export interface VarietyTrial {
	block: string;
	crop: string;
	varieties: { variety: string; lanes: number; mean: number; stratum: string }[];
	comparisons: GroupComparison[];
}

/** Varieties within each trial block (lanes sharing a trial label other than a check), each against the block's first variety. */
export function varietyTrials(yields: LaneYield[]): VarietyTrial[] {
	const blocks = new Map<string, LaneYield[]>();
	for (const l of yields) {
		if (!l.trialLabel || l.isCheck || !l.variety) continue;
		const key = `${l.trialLabel}\u0000${l.crop}`;
		blocks.set(key, [...(blocks.get(key) ?? []), l]);
	}
	const trials: VarietyTrial[] = [];
	for (const [key, lanes] of blocks) {
		const [block, crop] = key.split('\u0000');
		const trial: VarietyTrial = { block, crop, varieties: [], comparisons: [] };
		const byStratum = groupBy(samples(lanes), (s) => s.stratum);
		for (const [stratum, list] of byStratum) {
			const byVariety = groupBy(list, (s) => s.lane.variety!);
			const names = [...byVariety.keys()].sort();
			for (const v of names) trial.varieties.push({ variety: v, lanes: byVariety.get(v)!.length, mean: mean(byVariety.get(v)!.map((s) => s.value)), stratum });
			const reference = names[0];
			for (const v of names.slice(1)) {
				trial.comparisons.push({
					label: v, against: reference, stratum,
					comparison: welchDifference(byVariety.get(v)!.map((s) => s.value), byVariety.get(reference)!.map((s) => s.value))
				});
			}
		}
		trials.push(trial);
	}
	return trials.sort((a, b) => a.block.localeCompare(b.block));
}

/** How a lane is planted, for grouping strips against the check: rows and their spacing. */
export function rowLayoutLabel(l: AnalysisLane): string {
	const spacing = l.rows > 0 ? Math.round(((l.widthFt * 12) / l.rows) * 10) / 10 : 0;
	return `${l.rows} rows on ${spacing} in`;
}

/** Per crop, each row layout of ordinary strips against the check strips of the same crop. */
export function checkComparisons(yields: LaneYield[]): GroupComparison[] {
	const out: GroupComparison[] = [];
	const crops = [...new Set(yields.filter((l) => l.isCheck).map((l) => l.crop))].sort();
	for (const crop of crops) {
		const all = samples(yields.filter((l) => l.crop === crop && l.kind === 'crop'));
		for (const [stratum, list] of groupBy(all, (s) => s.stratum)) {
			const checks = list.filter((s) => s.lane.isCheck);
			if (!checks.length) continue;
			for (const [layout, strips] of groupBy(list.filter((s) => !s.lane.isCheck), (s) => rowLayoutLabel(s.lane))) {
				out.push({
					label: `${crop}, ${layout}`,
					against: `${crop} check strip (${rowLayoutLabel(checks[0].lane)})`,
					stratum,
					comparison: welchDifference(strips.map((s) => s.value), checks.map((s) => s.value))
				});
			}
		}
	}
	return out;
}

export interface LandEquivalent {
	crops: { crop: string; stripYield: number; landShare: number; soleYield: number | null; soleFrom: 'check strip' | 'entered' | null }[];
	/** null until every grain crop of the strips has a sole-crop yield */
	ler: number | null;
	missing: string[];
	/** Lanes without a grain yield (pasture, cover) that take land in the mixture. */
	unweighedShare: number;
}

/**
 * The land equivalent ratio of the field's strips (check strips left out) against sole-crop yields:
 * from the field's check strips, else as entered. R. Mead & R. W. Willey, Experimental Agriculture
 * 16:217–228 (1980), through the agronomy module.
 */
export function landEquivalent(yields: LaneYield[], entered: Record<string, number> = {}): LandEquivalent {
	const mixture = yields.filter((l) => !l.isCheck);
	const totalAcres = mixture.reduce((s, l) => s + l.acres, 0);
	const crops: LandEquivalent['crops'] = [];
	let weighedAcres = 0;
	for (const [crop, lanes] of groupBy(mixture.filter((l) => l.kind === 'crop' && isGrainCrop(l.crop)), (l) => l.crop)) {
		const withYield = lanes.filter((l) => l.laneYield != null);
		const acres = lanes.reduce((s, l) => s + l.acres, 0);
		weighedAcres += acres;
		if (!withYield.length) continue;
		const checks = yields.filter((l) => l.isCheck && l.crop === crop && l.laneYield != null);
		const sole = checks.length ? mean(checks.map((l) => l.laneYield!)) : entered[crop] > 0 ? entered[crop] : null;
		crops.push({
			crop,
			stripYield: weightedMean(withYield.map((l) => [l.laneYield!, l.acres])),
			landShare: totalAcres > 0 ? acres / totalAcres : 0,
			soleYield: sole,
			soleFrom: checks.length ? 'check strip' : sole != null ? 'entered' : null
		});
	}
	const missing = crops.filter((c) => c.soleYield == null).map((c) => c.crop);
	const ler = crops.length && !missing.length
		? landEquivalentRatioFromStrips(crops.map((c) => ({ stripYield: c.stripYield, landShare: c.landShare, soleYield: c.soleYield! })))
		: null;
	return { crops, ler, missing, unweighedShare: totalAcres > 0 ? 1 - weighedAcres / totalAcres : 0 };
}

function weightedMean(pairs: [number, number][]): number {
	const w = pairs.reduce((s, [, a]) => s + a, 0);
	return w > 0 ? pairs.reduce((s, [v, a]) => s + v * a, 0) / w : mean(pairs.map(([v]) => v));
}

function groupBy<T>(list: T[], key: (t: T) => string): Map<string, T[]> {
	const m = new Map<string, T[]>();
	for (const item of list) {
		const k = key(item);
		const arr = m.get(k);
		if (arr) arr.push(item);
		else m.set(k, [item]);
	}
	return m;
}

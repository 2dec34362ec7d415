// When animals may not go onto a lane: label grazing intervals of products put on it, spraying on
// a neighbouring lane within the last day, and harvest of the lane. Pure.
import { restrictionEndsInZone } from '../agronomy/index';

export type BlockReason = 'grazing-interval' | 'neighbour-spraying' | 'harvest';

export interface Block {
	laneIndex: number;
	reason: BlockReason;
	startsAt: string;
	endsAt: string;
	/** What caused it, in words: the product and the lane it went on. */
	cause: string;
}

export interface SprayedProduct {
	laneIndex: number;
	productName: string;
	startedAt: Date;
	endedAt: Date;
	grazingDays: number | null;
}

export interface SprayingPass {
	laneIndex: number;
	startedAt: Date;
	endedAt: Date;
}

export interface HarvestDay {
	laneIndex: number;
	startsAt: Date;
	endsAt: Date;
}

/** Hours after spraying ends that a neighbouring lane stays closed to animals (drift; common practice). */
export const NEIGHBOUR_SPRAY_HOURS = 24;
const HOUR = 3_600_000;

/**
 * Every block on the given lanes. A grazing interval runs from the start of the application to the
 * label's days after its end, counted as calendar days in the farm's time zone (the label is the
 * law; NPIC). Spraying on lane ±1 closes a lane from the start of the spraying to 24 h after it ends.
 */
export function laneBlocks(
	laneIndexes: number[],
	products: SprayedProduct[],
	sprayings: SprayingPass[],
	harvests: HarvestDay[],
	timeZone: string
): Block[] {
	const wanted = new Set(laneIndexes);
	const blocks: Block[] = [];
	for (const p of products) {
		if (!wanted.has(p.laneIndex) || p.grazingDays == null) continue;
		const ends = restrictionEndsInZone(p.endedAt, { days: p.grazingDays }, timeZone);
		blocks.push({
			laneIndex: p.laneIndex,
			reason: 'grazing-interval',
			startsAt: p.startedAt.toISOString(),
			endsAt: ends.toISOString(),
			cause: `${p.productName}: grazing interval of ${p.grazingDays} ${p.grazingDays === 1 ? 'day' : 'days'} on the label`
		});
	}
	const seen = new Set<string>();
	for (const s of sprayings) {
		for (const neighbour of [s.laneIndex - 1, s.laneIndex + 1]) {
			if (!wanted.has(neighbour)) continue;
			const key = `${neighbour}:${s.startedAt.getTime()}:${s.endedAt.getTime()}`;
			if (seen.has(key)) continue;
			seen.add(key);
			blocks.push({
				laneIndex: neighbour,
				reason: 'neighbour-spraying',
				startsAt: s.startedAt.toISOString(),
				endsAt: new Date(s.endedAt.getTime() + NEIGHBOUR_SPRAY_HOURS * HOUR).toISOString(),
				cause: `spraying on lane ${s.laneIndex + 1} next to it (closed until ${NEIGHBOUR_SPRAY_HOURS} h after the spraying ended)`
			});
		}
	}
	for (const h of harvests) {
		if (!wanted.has(h.laneIndex)) continue;
		blocks.push({ laneIndex: h.laneIndex, reason: 'harvest', startsAt: h.startsAt.toISOString(), endsAt: h.endsAt.toISOString(), cause: 'harvest of the lane' });
	}
	return blocks.sort((a, b) => a.laneIndex - b.laneIndex || a.startsAt.localeCompare(b.startsAt));
}

/** The blocks on `laneIndex` that overlap the span [startsAt, endsAt). */
export function blocksDuring(blocks: Block[], laneIndex: number, startsAt: Date, endsAt: Date): Block[] {
	return blocks.filter((b) => b.laneIndex === laneIndex && Date.parse(b.startsAt) < endsAt.getTime() && Date.parse(b.endsAt) > startsAt.getTime());
}

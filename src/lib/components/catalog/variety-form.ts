// What the variety and seed-lot forms hold, as typed.
export interface VarietyFormValues {
	crop: string;
	name: string;
	relativeMaturity: string;
	seedsPerUnit: string;
	traits: string;
	notes: string;
	version: string;
}

export interface LotFormValues {
	lotNumber: string;
	germinationPct: string;
	treatment: string;
	unitsOnHand: string;
}

/** Seeds in one unit when the seller's count is not at hand (common practice). */
export const USUAL_SEEDS_PER_UNIT: Record<string, number> = { corn: 80_000, soybean: 140_000 };

export function emptyVarietyValues(crop = 'corn'): VarietyFormValues {
	return { crop, name: '', relativeMaturity: '', seedsPerUnit: USUAL_SEEDS_PER_UNIT[crop] ? String(USUAL_SEEDS_PER_UNIT[crop]) : '', traits: '', notes: '', version: '' };
}

export function emptyLotValues(): LotFormValues {
	return { lotNumber: '', germinationPct: '', treatment: '', unitsOnHand: '' };
}

/** "105-day" for corn, "group 2.1" for soybean, the bare number otherwise. */
export function maturityText(crop: string, rm: number | null): string {
	if (rm === null) return '—';
	const c = crop.trim().toLowerCase();
	if (c === 'corn') return `${rm}-day`;
	if (c === 'soybean' || c === 'soybeans') return `group ${rm}`;
	return String(rm);
}

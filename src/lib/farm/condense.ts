// Long lane lists said once, compactly: "2, 4, 6 … 62". Pure.

/**
 * Lane numbers (1-based) as a short list: up to `max` numbers in full, otherwise the first three,
 * an ellipsis and the last. Sorted, duplicates dropped.
 * @example compactNumbers([2, 4, 6, 8, 10, 12, 62]) // "2, 4, 6 … 62"
 */
export function compactNumbers(numbers: readonly number[], max = 6): string {
	const sorted = [...new Set(numbers)].sort((a, b) => a - b);
	if (sorted.length <= max) return sorted.join(', ');
	return `${sorted.slice(0, 3).join(', ')} … ${sorted[sorted.length - 1]}`;
}

/** "1 lane" / "31 lanes". */
export function lanesWord(n: number): string {
	return `${n} lane${n === 1 ? '' : 's'}`;
}

/** A warning about one lane (or none), of a kind, as the rotation and equipment checks give them. */
export interface LaneWarning {
	kind: string;
	laneIndex: number | null;
	message: string;
}

export interface CondensedWarning {
	kind: string;
	/** One line for the kind, lanes listed compactly. */
	summary: string;
	/** Every message of the kind, for an expandable full list. */
	details: string[];
	laneNumbers: number[];
}

/**
 * One line per kind of warning instead of one box per lane. Warnings without a lane keep their
 * own message; lane warnings of a kind become `describe(count, "2, 4, 6 … 62")`.
 * @example condenseWarnings(ws, { corn_borders_corn: (n, lanes) => `${n} corn lanes (${lanes}) border last season's corn: scout their edge rows for rootworm.` })
 */
export function condenseWarnings(warnings: readonly LaneWarning[], describe: Record<string, (count: number, lanes: string) => string> = {}): CondensedWarning[] {
	const out: CondensedWarning[] = [];
	const byKind = new Map<string, LaneWarning[]>();
	for (const w of warnings) {
		if (w.laneIndex === null) {
			out.push({ kind: w.kind, summary: w.message, details: [w.message], laneNumbers: [] });
			continue;
		}
		const list = byKind.get(w.kind) ?? [];
		list.push(w);
		byKind.set(w.kind, list);
	}
	for (const [kind, list] of byKind) {
		const numbers = [...new Set(list.map((w) => (w.laneIndex as number) + 1))].sort((a, b) => a - b);
		const lanes = compactNumbers(numbers);
		const summary = list.length === 1 ? list[0].message : (describe[kind]?.(numbers.length, lanes) ?? `${lanesWord(numbers.length)} (${lanes}): ${list[0].message}`);
		out.push({ kind, summary, details: list.map((w) => w.message), laneNumbers: numbers });
	}
	return out;
}

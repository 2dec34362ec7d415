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

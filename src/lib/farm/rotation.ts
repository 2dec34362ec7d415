// What followed what across the whole farm: each field's rotation matrix, summed. Pure.
import type { RotationCell } from '../geometry/rotation';

/**
 * Sums the per-field (previous crop → next crop) acres into one farm matrix, with the same
 * semantics as `rotationMatrix`: one entry per pair with acres, sorted by from, then to.
 * @example sumRotations([[{ from: 'corn', to: 'soybean', acres: 40 }], [{ from: 'corn', to: 'soybean', acres: 10 }]]) // [{ from: 'corn', to: 'soybean', acres: 50 }]
 */
export function sumRotations(matrices: readonly (readonly RotationCell[])[]): RotationCell[] {
	const cells = new Map<string, RotationCell>();
	for (const matrix of matrices) {
		for (const c of matrix) {
			const key = JSON.stringify([c.from, c.to]);
			const cell = cells.get(key);
			if (cell) cell.acres += c.acres;
			else cells.set(key, { from: c.from, to: c.to, acres: c.acres });
		}
	}
	return [...cells.values()].sort((x, y) => (x.from === y.from ? (x.to < y.to ? -1 : x.to > y.to ? 1 : 0) : x.from < y.from ? -1 : 1));
}

/** The crops of a matrix as rows (from) and columns (to), for a table. */
export function rotationAxes(matrix: readonly RotationCell[]): { from: string[]; to: string[] } {
	return { from: [...new Set(matrix.map((c) => c.from))].sort(), to: [...new Set(matrix.map((c) => c.to))].sort() };
}

/** Acres of one pair, 0 when absent. */
export function rotationAcres(matrix: readonly RotationCell[], from: string, to: string): number {
	return matrix.find((c) => c.from === from && c.to === to)?.acres ?? 0;
}

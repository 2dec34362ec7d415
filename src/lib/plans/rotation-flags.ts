// Warnings about what follows what from one season to the next. Pure.
import type { Lane } from '../geometry/index';

export interface RotationWarning {
	kind: 'same_crop' | 'corn_borders_corn';
	laneIndex: number | null;
	message: string;
}

const CORN = /\bcorn\b/i;
/** Edges closer than this count as touching (a few inches of rounding across a field). */
const TOUCH_FT = 0.25;

/**
 * Same crop on the same ground, and corn lanes that stand next to last season's corn: rootworm
 * larvae move from old corn into the first row of new corn (common practice). Lanes are compared
 * by their offsets across the A-B line, so both seasons must share the A-B line; when they do
 * not, only the acre matrix (rotationMatrix) applies.
 */
export function rotationWarnings(
	previous: Pick<Lane, 'index' | 'crop' | 'offsetFt' | 'widthFt' | 'kind'>[],
	next: Pick<Lane, 'index' | 'crop' | 'offsetFt' | 'widthFt' | 'kind'>[],
	matrix: { from: string; to: string; acres: number }[],
	sameGuidance: boolean
): RotationWarning[] {
	const out: RotationWarning[] = [];
	for (const cell of matrix) {
		if (cell.from === cell.to && cell.acres >= 0.01 && cell.from !== 'pasture') {
			out.push({ kind: 'same_crop', laneIndex: null, message: `${cell.acres.toFixed(2)} ac of ${cell.to} follows ${cell.from}.` });
		}
	}
	if (!sameGuidance) return out;
	const oldCorn = previous.filter((l) => l.kind === 'crop' && CORN.test(l.crop));
	for (const lane of next.filter((l) => l.kind === 'crop' && CORN.test(l.crop))) {
		const left = lane.offsetFt;
		const right = lane.offsetFt + lane.widthFt;
		const touching = oldCorn.filter((o) => Math.abs(o.offsetFt + o.widthFt - left) < TOUCH_FT || Math.abs(o.offsetFt - right) < TOUCH_FT);
		const overlapping = oldCorn.some((o) => o.offsetFt < right - TOUCH_FT && o.offsetFt + o.widthFt > left + TOUCH_FT);
		if (touching.length && !overlapping) {
			out.push({
				kind: 'corn_borders_corn',
				laneIndex: lane.index,
				message: `Lane ${lane.index + 1} (corn) borders last season's corn: scout its edge row for rootworm.`
			});
		}
	}
	return out;
}

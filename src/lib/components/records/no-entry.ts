// "No entry" on the lane map: a dark red with a white cross over it, so it reads without colour
// vision, in grey print and in sunlight, and is never mistaken for a crop colour.
export const NO_ENTRY_COLOR = '#9b1c1c';

let cached: CanvasPattern | string | undefined;

export function noEntryFill(): CanvasPattern | string {
	if (cached) return cached;
	const tile = document.createElement('canvas');
	tile.width = tile.height = 10;
	const ctx = tile.getContext('2d');
	if (!ctx) return NO_ENTRY_COLOR;
	ctx.fillStyle = NO_ENTRY_COLOR;
	ctx.fillRect(0, 0, 10, 10);
	ctx.strokeStyle = 'rgba(255, 255, 255, 0.95)';
	ctx.lineWidth = 1.4;
	ctx.stroke(new Path2D('M0 0L10 10M10 0L0 10'));
	cached = ctx.createPattern(tile, 'repeat') ?? NO_ENTRY_COLOR;
	return cached;
}

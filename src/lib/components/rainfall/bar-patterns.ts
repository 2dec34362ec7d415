// Bar fills told apart by pattern as well as shade, so a black-and-white printout and a
// colour-blind reader can still match bars to gauges. The legend draws the same fills.

export const PATTERN_NAMES = ['solid', 'diagonal lines', 'dots', 'crossed lines', 'horizontal lines', 'open'] as const;

const SHADES = ['#1a2634', '#52657a', '#2f4257', '#8a6a45', '#3d5064', '#5b4326'];

/** A canvas pattern (or colour) for the n-th gauge. */
export function barFill(n: number): CanvasPattern | string {
	const kind = PATTERN_NAMES[n % PATTERN_NAMES.length];
	const shade = SHADES[n % SHADES.length];
	if (kind === 'solid') return shade;
	const size = 8;
	const tile = document.createElement('canvas');
	tile.width = tile.height = size;
	const ctx = tile.getContext('2d');
	if (!ctx) return shade;
	ctx.fillStyle = '#ffffff';
	ctx.fillRect(0, 0, size, size);
	ctx.strokeStyle = ctx.fillStyle = shade;
	ctx.lineWidth = 2;
	ctx.beginPath();
	if (kind === 'diagonal lines') {
		ctx.moveTo(0, size);
		ctx.lineTo(size, 0);
		ctx.moveTo(-2, 2);
		ctx.lineTo(2, -2);
		ctx.moveTo(size - 2, size + 2);
		ctx.lineTo(size + 2, size - 2);
		ctx.stroke();
	} else if (kind === 'dots') {
		ctx.arc(size / 2, size / 2, 2, 0, Math.PI * 2);
		ctx.fill();
	} else if (kind === 'crossed lines') {
		ctx.moveTo(0, 0);
		ctx.lineTo(size, size);
		ctx.moveTo(size, 0);
		ctx.lineTo(0, size);
		ctx.stroke();
	} else if (kind === 'horizontal lines') {
		ctx.moveTo(0, size / 2);
		ctx.lineTo(size, size / 2);
		ctx.stroke();
	}
	return ctx.createPattern(tile, 'repeat') ?? shade;
}

export function barBorder(n: number): string {
	return SHADES[n % SHADES.length];
}

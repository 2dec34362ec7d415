// Lane kinds are told apart by a mark over the crop colour, not by colour alone: a reader with
// colour-blindness, a grey printout and a sunlit cab screen all still see which lanes are which.

export type LaneKindMark = 'crop' | 'pasture' | 'cover' | 'buffer';

export const LANE_KIND_MARKS: { kind: LaneKindMark; mark: string }[] = [
	{ kind: 'crop', mark: 'solid' },
	{ kind: 'pasture', mark: 'diagonal lines' },
	{ kind: 'cover', mark: 'dots' },
	{ kind: 'buffer', mark: 'crossed lines' }
];

const TILE = 10;
const cache = new Map<string, CanvasPattern | string>();

/** Draws the kind's mark in white on a tile `size` pixels square (canvas or SVG path data). */
export function markPath(kind: string, size = TILE): string {
	const s = size;
	const h = s / 2;
	if (kind === 'pasture') return `M0 ${s}L${s} 0M${-h} ${h}L${h} ${-h}M${h} ${s + h}L${s + h} ${h}`;
	if (kind === 'buffer') return `M0 ${s}L${s} 0M0 0L${s} ${s}`;
	if (kind === 'cover') return `M${h - 1.6} ${h}a1.6 1.6 0 1 0 3.2 0a1.6 1.6 0 1 0 -3.2 0`;
	return '';
}

/**
 * The fill for a lane on Leaflet's canvas renderer: the plain colour for crop lanes, a repeating
 * pattern for the other kinds (canvas takes a CanvasPattern wherever it takes a colour).
 */
export function laneFill(kind: string, color: string): CanvasPattern | string {
	const path = markPath(kind);
	if (!path) return color;
	const key = `${kind}|${color}`;
	const known = cache.get(key);
	if (known) return known;
	const tile = document.createElement('canvas');
	tile.width = tile.height = TILE;
	const ctx = tile.getContext('2d');
	if (!ctx) return color;
	ctx.fillStyle = color;
	ctx.fillRect(0, 0, TILE, TILE);
	ctx.strokeStyle = ctx.fillStyle = 'rgba(255, 255, 255, 0.9)';
	ctx.lineWidth = 1.6;
	const p = new Path2D(path);
	if (kind === 'cover') ctx.fill(p);
	else ctx.stroke(p);
	const pattern = ctx.createPattern(tile, 'repeat') ?? color;
	cache.set(key, pattern);
	return pattern;
}

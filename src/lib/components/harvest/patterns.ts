// Fills that stay apart on a black-and-white printout: solid, hatched, dotted, cross-hatched.
// Built on a small canvas so chart.js can use them as bar fills.
export type FillStyle = 'solid' | 'hatch' | 'dots' | 'cross' | 'open';

export function fillPattern(ctx: CanvasRenderingContext2D, style: FillStyle, ink = '#1f2937'): CanvasPattern | string {
	if (style === 'solid') return ink;
	const size = 8;
	const c = document.createElement('canvas');
	c.width = size;
	c.height = size;
	const p = c.getContext('2d');
	if (!p) return ink;
	p.fillStyle = '#ffffff';
	p.fillRect(0, 0, size, size);
	p.strokeStyle = ink;
	p.fillStyle = ink;
	p.lineWidth = 1.5;
	if (style === 'hatch' || style === 'cross') {
		p.beginPath();
		p.moveTo(0, size);
		p.lineTo(size, 0);
		p.moveTo(-2, 2);
		p.lineTo(2, -2);
		p.moveTo(size - 2, size + 2);
		p.lineTo(size + 2, size - 2);
		p.stroke();
	}
	if (style === 'cross') {
		p.beginPath();
		p.moveTo(0, 0);
		p.lineTo(size, size);
		p.stroke();
	}
	if (style === 'dots') {
		p.beginPath();
		p.arc(size / 2, size / 2, 1.6, 0, Math.PI * 2);
		p.fill();
	}
	return ctx.createPattern(c, 'repeat') ?? ink;
}

// Lane map thumbnail: field boundary, no-plant areas, lanes by crop, lane numbers and the A-B line,
// drawn as vector paths with a local equirectangular projection scaled to the box.
import type { MultiPolygon, Polygon, Position } from 'geojson';
import type { SheetData, SheetLane } from '../../sheet/types';
import { drawSwatch, paintPattern, styleOf, type Box, type CropStyle } from './crop-style';
import { INK, PAPER, SheetWriter, type TextStyle } from './writer';

type Rings = Position[][];

/** Metres per degree of latitude on a sphere of the Earth's mean radius. */
const METRES_PER_DEGREE = (6_371_008.8 * Math.PI) / 180;
const FEET_PER_METRE = 1 / 0.3048;

const polygonsOf = (g: Polygon | MultiPolygon): Rings[] => (g.type === 'Polygon' ? [g.coordinates] : g.coordinates);

interface Projection {
	point: (p: Position) => [number, number];
	pointsPerFoot: number;
	height: number;
}

function project(data: SheetData, box: Box): Projection | null {
	const all: Position[] = [data.guidance.a, data.guidance.b];
	const collect = (g: Polygon | MultiPolygon) => polygonsOf(g).forEach((rings) => rings.forEach((r) => all.push(...r)));
	collect(data.boundary);
	data.exclusions.forEach((e) => collect(e.geometry));
	data.lanes.forEach((l) => collect(l.geometry));
	const finite = all.filter((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]));
	if (finite.length < 2) return null;
	const lngs = finite.map((p) => p[0]);
	const lats = finite.map((p) => p[1]);
	const [minLng, maxLng, minLat, maxLat] = [Math.min(...lngs), Math.max(...lngs), Math.min(...lats), Math.max(...lats)];
	const shrink = Math.cos((((minLat + maxLat) / 2) * Math.PI) / 180);
	const spanX = (maxLng - minLng) * shrink;
	const spanY = maxLat - minLat;
	if (!(spanX > 0 || spanY > 0)) return null;
	const scale = Math.min(spanX > 0 ? box.width / spanX : Infinity, spanY > 0 ? box.height / spanY : Infinity);
	const height = Math.max(spanY * scale, 40);
	const offsetX = box.x + (box.width - spanX * scale) / 2;
	const offsetY = box.y + (height - spanY * scale) / 2;
	return {
		point: (p) => [offsetX + (p[0] - minLng) * shrink * scale, offsetY + (maxLat - p[1]) * scale],
		pointsPerFoot: scale / (METRES_PER_DEGREE * FEET_PER_METRE),
		height
	};
}

function tracePath(doc: PDFKit.PDFDocument, g: Polygon | MultiPolygon, proj: Projection): void {
	for (const rings of polygonsOf(g)) {
		for (const ring of rings) {
			// a ring with a broken coordinate is left out rather than written into the PDF
			if (ring.length < 3 || !ring.every((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]))) continue;
			ring.forEach((p, i) => {
				const [x, y] = proj.point(p);
				if (i === 0) doc.moveTo(x, y);
				else doc.lineTo(x, y);
			});
			doc.closePath();
		}
	}
}

/** Screen box of a lane's largest part (so a lane cut in two is labelled on solid ground). */
function screenBox(g: Polygon | MultiPolygon, proj: Projection): Box {
	let best: Box = { x: NaN, y: NaN, width: 0, height: 0 };
	for (const rings of polygonsOf(g)) {
		const pts = (rings[0] ?? []).map((p) => proj.point(p));
		if (pts.length === 0) continue;
		const xs = pts.map((p) => p[0]);
		const ys = pts.map((p) => p[1]);
		const x = Math.min(...xs);
		const y = Math.min(...ys);
		const box = { x, y, width: Math.max(...xs) - x, height: Math.max(...ys) - y };
		if (!(best.width * best.height >= box.width * box.height)) best = box;
	}
	return best;
}

const overlaps = (a: Box, b: Box) =>
	a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

/** Label every `step`-th lane (plus the first and last), with step 1, 2, 5, 10, 20, 25, 50 … */
function labelStep(laneWidthPoints: number, labelWidth: number): number {
	for (const step of [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500]) {
		// labels alternate between two rows, so two steps of lanes must hold one label
		if (2 * step * laneWidthPoints >= labelWidth + 4) return step;
	}
	return 1000;
}

/**
 * Lane numbers on white tags: lane 1, every `step`-th lane and the last lane, alternating between
 * two rows across the middle of the field; a tag that would overlap another is left out.
 */
function drawLaneLabels(w: SheetWriter, data: SheetData, proj: Projection, frame: Box): void {
	const style: TextStyle = { size: 9, bold: true };
	const height = 12;
	const lanes = [...data.lanes].sort((a, b) => a.index - b.index);
	if (lanes.length === 0) return;
	const [ax, ay] = proj.point(data.guidance.a);
	const [bx, by] = proj.point(data.guidance.b);
	const along = Math.hypot(bx - ax, by - ay) || 1;
	const dir = [(bx - ax) / along, (by - ay) / along];
	const meanWidth = (lanes.reduce((sum, l) => sum + l.widthFt, 0) / lanes.length) * proj.pointsPerFoot;
	const widest = w.textWidth(String(lanes[lanes.length - 1].index + 1), style) + 4;
	const step = labelStep(meanWidth, widest);
	const last = lanes[lanes.length - 1];
	const wanted = lanes.filter((l, i) => i === 0 || l === last || (l.index + 1) % step === 0);
	// first and last are placed before the rest so they always get a tag
	const tryOrder = wanted.length > 1 ? [wanted[0], last, ...wanted.slice(1, -1)] : wanted;
	const placed: Box[] = [];
	const chosen: { text: string; box: Box }[] = [];
	for (const lane of tryOrder) {
		const lb = screenBox(lane.geometry, proj);
		if (!Number.isFinite(lb.x)) continue;
		const text = String(lane.index + 1);
		const width = w.textWidth(text, style) + 4;
		const row = step === 1 ? 0 : wanted.indexOf(lane) % 2;
		const offset = row * (height + 4) - (step === 1 ? 0 : (height + 4) / 2);
		const cx = lb.x + lb.width / 2 + dir[0] * offset;
		const cy = lb.y + lb.height / 2 + dir[1] * offset;
		const box = {
			x: Math.min(Math.max(cx - width / 2, frame.x), frame.x + frame.width - width),
			y: Math.min(Math.max(cy - height / 2, frame.y), frame.y + frame.height - height),
			width,
			height
		};
		const spaced = { x: box.x - 1.5, y: box.y - 1, width: box.width + 3, height: box.height + 2 };
		if (placed.some((p) => overlaps(p, spaced))) continue;
		placed.push(spaced);
		chosen.push({ text, box });
	}
	for (const { text, box } of chosen) {
		w.doc.lineWidth(0.6).rect(box.x, box.y, box.width, box.height).fillAndStroke(PAPER, INK);
		w.writeLine(text, box.x, box.y + 1.5, style, box.width);
	}
	w.doc.fillColor(INK);
}

function drawGuidanceLine(w: SheetWriter, data: SheetData, proj: Projection): void {
	const { doc } = w;
	const [ax, ay] = proj.point(data.guidance.a);
	const [bx, by] = proj.point(data.guidance.b);
	doc.save().lineCap('round');
	doc.lineWidth(5).strokeColor(PAPER).moveTo(ax, ay).lineTo(bx, by).stroke();
	doc.lineWidth(2).strokeColor(INK).dash(7, { space: 3 }).moveTo(ax, ay).lineTo(bx, by).stroke().undash();
	doc.restore();
}

function drawGuidanceEnds(w: SheetWriter, data: SheetData, proj: Projection): void {
	const { doc } = w;
	const [ax, ay] = proj.point(data.guidance.a);
	const [bx, by] = proj.point(data.guidance.b);
	for (const [x, y, letter] of [
		[ax, ay, 'A'],
		[bx, by, 'B']
	] as const) {
		doc.lineWidth(1.5).circle(x, y, 8).fillAndStroke(PAPER, INK);
		w.writeLine(letter, x - 8, y - 6, { size: 11, bold: true, align: 'center' }, 16);
	}
}

function drawNorthArrow(w: SheetWriter, x: number, y: number): void {
	w.doc.polygon([x, y + 18], [x + 6, y + 4], [x + 12, y + 18], [x + 6, y + 14]).fill(INK);
	w.writeLine('N', x, y + 19, { size: 10, bold: true, align: 'center' }, 12);
}

/** Scale bar of a round length up to 110 points long, drawn with its top-left at (x, y). */
function scaleBar(proj: Projection): { feet: number; length: number } {
	const lengths = [10, 20, 50, 100, 200, 250, 500, 1000, 1320, 2000, 2640, 5000, 10_000];
	const feet = [...lengths].reverse().find((ft) => ft * proj.pointsPerFoot <= 110) ?? lengths[0];
	return { feet, length: feet * proj.pointsPerFoot };
}

/** Legend in rows inside the column [left, left + width] starting at top; returns the bottom. */
function drawLegend(
	w: SheetWriter,
	styles: CropStyle[],
	hasExclusions: boolean,
	proj: Projection,
	column: { left: number; top: number; width: number }
): number {
	const style: TextStyle = { size: 11 };
	const items: { label: string; width?: number; swatch: (x: number, y: number) => void }[] = styles.map((s) => ({
		label: `${s.code} = ${s.crop}`,
		swatch: (x, y) => drawSwatch(w.doc, s, x, y, 13)
	}));
	if (hasExclusions)
		items.push({
			label: 'no-plant area',
			swatch: (x, y) => {
				w.doc.save().rect(x, y, 13, 13).clip();
				paintPattern(w.doc, 'grid', { x, y, width: 13, height: 13 }, 3);
				w.doc.restore().lineWidth(1).dash(2, { space: 1.5 }).rect(x, y, 13, 13).stroke().undash();
			}
		});
	items.push({
		label: 'A-B line',
		swatch: (x, y) => w.doc.lineWidth(2).dash(4, { space: 2 }).moveTo(x, y + 6.5).lineTo(x + 13, y + 6.5).stroke().undash()
	});
	const scale = scaleBar(proj);
	items.push({
		label: `${scale.feet.toLocaleString('en-US')} ft`,
		width: scale.length,
		swatch: (x, y) => {
			w.doc.lineWidth(2).strokeColor(INK).moveTo(x, y + 6.5).lineTo(x + scale.length, y + 6.5).stroke();
			w.doc.lineWidth(1).moveTo(x, y + 2).lineTo(x, y + 11).moveTo(x + scale.length, y + 2).lineTo(x + scale.length, y + 11).stroke();
		}
	});
	let x = column.left;
	let y = column.top;
	for (const item of items) {
		const mark = item.width ?? 13;
		const width = mark + 5 + w.textWidth(item.label, style) + 16;
		if (x + width - 16 > column.left + column.width && x > column.left) {
			x = column.left;
			y += 17;
		}
		item.swatch(x, y + 1);
		w.writeLine(item.label, x + mark + 5, y, style);
		x += width;
	}
	return y + 17;
}

/**
 * Lane map with its caption and legend inside `area` (the map at most area.height tall, the
 * legend below it); does not move the cursor. Returns the bottom of what it drew.
 */
export function drawLaneMap(w: SheetWriter, data: SheetData, styles: Map<string, CropStyle>, area: Box): number {
	const { doc } = w;
	w.writeLine('Lane map', area.x, area.y, { size: 12, bold: true });
	const frame: Box = { x: area.x, y: area.y + 17, width: area.width, height: area.height };
	const inner: Box = { x: frame.x + 20, y: frame.y + 16, width: frame.width - 40, height: frame.height - 32 };
	const proj = project(data, inner);
	if (!proj) {
		w.write('The field has no shape to draw.', frame.x, frame.y, frame.width, { size: 11 });
		return frame.y + 16;
	}
	frame.height = proj.height + 32;

	doc.save();
	doc.rect(frame.x, frame.y, frame.width, frame.height).clip();

	const byCrop = new Map<CropStyle, SheetLane[]>();
	for (const lane of data.lanes) {
		const style = styleOf(styles, lane.crop);
		byCrop.set(style, [...(byCrop.get(style) ?? []), lane]);
	}
	for (const [style, lanes] of byCrop) {
		lanes.forEach((l) => tracePath(doc, l.geometry, proj));
		doc.fill(style.fill, 'even-odd');
		doc.save();
		lanes.forEach((l) => tracePath(doc, l.geometry, proj));
		doc.clip('even-odd');
		paintPattern(doc, style.pattern, frame);
		doc.restore();
	}
	const meanLaneWidth =
		data.lanes.reduce((sum, l) => sum + l.widthFt, 0) / Math.max(1, data.lanes.length) * proj.pointsPerFoot;
	if (meanLaneWidth >= 4) {
		data.lanes.forEach((l) => tracePath(doc, l.geometry, proj));
		doc.lineWidth(0.5).strokeColor(INK).stroke();
	}

	for (const exclusion of data.exclusions) {
		tracePath(doc, exclusion.geometry, proj);
		doc.fill(PAPER, 'even-odd');
		doc.save();
		tracePath(doc, exclusion.geometry, proj);
		doc.clip('even-odd');
		paintPattern(doc, 'grid', frame, 3);
		doc.restore();
		tracePath(doc, exclusion.geometry, proj);
		doc.lineWidth(1.2).strokeColor(INK).dash(3, { space: 2 }).stroke().undash();
	}

	tracePath(doc, data.boundary, proj);
	doc.lineWidth(1.8).strokeColor(INK).stroke();

	drawGuidanceLine(w, data, proj);
	drawLaneLabels(w, data, proj, frame);
	drawGuidanceEnds(w, data, proj);
	drawNorthArrow(w, frame.x + frame.width - 20, frame.y + 4);
	doc.restore();

	doc.lineWidth(0.8).strokeColor(INK).rect(frame.x, frame.y, frame.width, frame.height).stroke();
	return drawLegend(w, [...byCrop.keys()], data.exclusions.length > 0, proj, {
		left: frame.x,
		top: frame.y + frame.height + 5,
		width: frame.width
	});
}

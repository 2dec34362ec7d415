import type { MultiPolygon, Polygon, Position } from 'geojson';
import { geodesicAcres } from './area';
import { erodeShape, intersectShapes, orientShape, shapeArea, subtractShapes, unionShapes, type PlaneShape } from './clip';
import { clipToBand } from './slab';
import { centredProjection, toPlane } from './outline';
import { GeometryError } from './errors';
import { openMiddleIn, patternEdgesFt } from './pattern';
import { guidanceFrame, type XY } from './projection';
import { summariseByCrop, countBorderRows } from './totals';
import type { Lane, Layout, LayoutInput } from './types';
import { feetToMeters, metersToFeet, SQ_FEET_PER_ACRE } from './units';
import { MAX_FIELD_ACRES, validateLayoutInput } from './validate';

/** Lane pieces smaller than this are clipping dust along the boundary, not ground to plant: dropped. */
const SLIVER_M2 = 0.09290304; // 1 sq ft
/** A and B closer than this give no usable direction. */
const MIN_AB_M = 1;
/** A and B must lie within this distance of the field's outline box (keeps the local plane accurate). */
const MAX_AB_DISTANCE_M = 5_000;
/** Lanes one layout may cut; far beyond any field (a 20,000-acre section in 2-ft lanes is ~15,000). */
export const MAX_LANES = 20_000;
/**
 * Each lane is cut from the whole outline, so the work grows as corners × lanes; past this (a few
 * seconds) a layout is refused before it starts. It admits a 50,000-corner field in 500 lanes, or a
 * 2,000-corner one in 12,500.
 */
export const MAX_LANE_WORK = 25_000_000;

type Polygonal = Polygon | MultiPolygon;



function mapShape(shape: PlaneShape, f: (p: XY) => XY): PlaneShape {
	return shape.map((rings) => rings.map((ring) => ring.map((p) => f(p as XY))));
}

function toGeometry(shape: Position[][][]): Polygonal {
	return shape.length === 1 ? { type: 'Polygon', coordinates: shape[0] } : { type: 'MultiPolygon', coordinates: shape };
}

function bboxOf(shape: PlaneShape): [number, number, number, number] {
	let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
	for (const rings of shape) for (const p of rings[0] ?? []) {
		if (p[0] < minX) minX = p[0];
		if (p[0] > maxX) maxX = p[0];
		if (p[1] < minY) minY = p[1];
		if (p[1] > maxY) maxY = p[1];
	}
	return [minX, minY, maxX, maxY];
}


/**
 * Lays a repeating pattern of lanes parallel to the A-B line over a field and clips it to the
 * planted area = boundary − exclusions − headland. The headland is an inside band of `headlandFt`
 * along every edge of the boundary, its holes included (turns are made there too); exclusions get
 * no headland of their own. Where an exclusion overlaps the headland band, that ground counts as
 * excluded. Geometry is computed in a transverse Mercator plane centred on the field, where
 * straight parallel lines are true ground offsets; areas are ellipsoidal.
 *
 * @param input boundary, exclusions, A-B line, pattern, offset and headland
 * @returns lanes left to right (looking from A to B) and field totals
 * @throws GeometryError for every input that cannot be laid out
 * @example
 * layoutStrips({ boundary, guidance: { a, b }, pattern: [
 *   { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
 *   { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 } ] })
 */
export function layoutStrips(input: LayoutInput): Layout {
	validateLayoutInput(input);
	const fieldAcres = geodesicAcres(input.boundary);
	if (fieldAcres > MAX_FIELD_ACRES) {
		throw new GeometryError('field-too-large', `The field outline covers ${Math.round(fieldAcres).toLocaleString('en-US')} acres; fields are limited to ${MAX_FIELD_ACRES.toLocaleString('en-US')} acres. Check the outline or split the field.`);
	}

	const proj = centredProjection(input.boundary);
	const field = toPlane(input.boundary, proj.forward, proj.inverse, 'field boundary');
	const exclusionParts = (input.exclusions ?? []).map((ex, i) => toPlane(ex, proj.forward, proj.inverse, `exclusion ${i + 1}`));

	const a = proj.forward(input.guidance.a);
	const b = proj.forward(input.guidance.b);
	if (Math.hypot(b[0] - a[0], b[1] - a[1]) < MIN_AB_M) {
		throw new GeometryError('ab-same-point', 'Points A and B of the A-B line are the same point; set B at least a few feet from A along the rows.');
	}
	const [fx0, fy0, fx1, fy1] = bboxOf(field);
	for (const [name, p] of [['A', a], ['B', b]] as const) {
		const dx = Math.max(fx0 - p[0], 0, p[0] - fx1);
		const dy = Math.max(fy0 - p[1], 0, p[1] - fy1);
		if (Math.hypot(dx, dy) > MAX_AB_DISTANCE_M) {
			throw new GeometryError('ab-far-from-field', `Point ${name} of the A-B line is ${(Math.hypot(dx, dy) / 1609.344).toFixed(1)} miles from the field; it must lie within ${(MAX_AB_DISTANCE_M / 1609.344).toFixed(1)} miles. Check that the A-B line belongs to this field.`);
		}
	}

	// The field's extent across the rows bounds the planted area's: refuse an impossible pattern
	// before the costly clipping.
	const frame = guidanceFrame(a, b);
	let minS = Infinity, maxS = -Infinity;
	for (const rings of field) for (const p of rings[0]) {
		const [s] = frame.toST(p);
		if (s < minS) minS = s;
		if (s > maxS) maxS = s;
	}
	checkLaneBudget(input, metersToFeet(maxS - minS), cornersOf(field) + exclusionParts.reduce((n, x) => n + cornersOf(x), 0));

	// One polygon was checked for crossings above; several parts may overlap each other and are merged.
	const fieldClean = field.length > 1 ? unionShapes([field]) : orientShape(field);
	const excluded = exclusionParts.length > 0 ? intersectShapes(fieldClean, unionShapes(exclusionParts)) : [];
	const inner = erodeShape(fieldClean, feetToMeters(input.headlandFt ?? 0));
	const planted = subtractShapes(inner, [excluded]);
	if (shapeArea(planted) < SLIVER_M2) {
		if (excluded.length > 0 && shapeArea(subtractShapes(fieldClean, [excluded])) < SLIVER_M2) {
			throw new GeometryError('nothing-to-plant', 'The exclusions cover the whole field; nothing is left to plant.');
		}
		throw new GeometryError('nothing-to-plant', `Nothing is left to plant inside a ${input.headlandFt ?? 0}-ft headland; make the headland narrower.`);
	}
	const headland = subtractShapes(fieldClean, [inner, excluded]);

	const unproject = (shape: PlaneShape) => toGeometry(mapShape(shape, proj.inverse));
	const excludedAcres = excluded.length ? geodesicAcres(unproject(excluded)) : 0;
	const headlandAcres = headland.length ? geodesicAcres(unproject(headland)) : 0;
	const plantedAcres = geodesicAcres(unproject(planted));

	const lanes = cutLanes(input, planted, a, b, proj.inverse);
	return { lanes, fieldAcres, plantedAcres, headlandAcres, excludedAcres, byCrop: summariseByCrop(lanes) };
}

function cornersOf(shape: PlaneShape): number {
	return shape.reduce((n, rings) => rings.reduce((m, ring) => m + ring.length, n), 0);
}

/** Refuses, before any cutting, a layout with too many lanes or too much work (corners × lanes). */
function checkLaneBudget(input: LayoutInput, acrossFt: number, corners: number): void {
	const { starts, repeatFt } = patternEdgesFt(input.pattern);
	const lanesAcross = Math.round((acrossFt / repeatFt) * starts.length);
	if (!(lanesAcross <= MAX_LANES)) {
		throw new GeometryError(
			'too-many-lanes',
			`This pattern would cut the field into about ${Number.isFinite(lanesAcross) ? lanesAcross.toLocaleString('en-US') : 'endless'} lanes (${Math.round(acrossFt).toLocaleString('en-US')} ft across the rows); a layout may have at most ${MAX_LANES.toLocaleString('en-US')}. Use wider lanes or split the field.`
		);
	}
	if (lanesAcross * corners > MAX_LANE_WORK) {
		throw new GeometryError(
			'too-many-lanes',
			`The field's outline has ${corners.toLocaleString('en-US')} corners and this pattern cuts it into about ${lanesAcross.toLocaleString('en-US')} lanes: too much to lay out at once. Simplify the outline (fewer corners) or use wider lanes.`
		);
	}
}

/**
 * Cuts the planted area into lanes: the area is turned into the A-B frame, where every lane is a
 * band of constant s, and each band is clipped out directly. Neighbouring bands share one list of
 * edge positions, so lanes meet exactly with no gap or overlap.
 */
function cutLanes(input: LayoutInput, planted: PlaneShape, a: XY, b: XY, inverse: (p: XY) => [number, number]): Lane[] {
	const frame = guidanceFrame(a, b);
	const plantedST = orientShape(mapShape(planted, frame.toST));
	const [s0, , s1] = bboxOf(plantedST);
	const { starts, widths, repeatFt } = patternEdgesFt(input.pattern);
	// Only the offset's place within one repeat matters: reducing it keeps the lane counter small
	// and exact whatever offset is asked for.
	const offsetFt = (input.offsetFt ?? 0) % repeatFt;
	checkLaneBudget(input, metersToFeet(s1 - s0), cornersOf(plantedST));
	const firstRepeat = Math.floor((metersToFeet(s0) - offsetFt) / repeatFt) - 1;
	const lastRepeat = Math.ceil((metersToFeet(s1) - offsetFt) / repeatFt) + 1;

	interface Slot { patternIndex: number; leftFt: number; leftM: number; rightM: number; pieces: PlaneShape }
	const slots: Slot[] = [];
	for (let r = firstRepeat; r <= lastRepeat; r++) {
		for (let j = 0; j < starts.length; j++) {
			const leftFt = offsetFt + r * repeatFt + starts[j];
			const rightFt = j + 1 < starts.length ? offsetFt + r * repeatFt + starts[j + 1] : offsetFt + (r + 1) * repeatFt;
			if (feetToMeters(rightFt) <= s0 || feetToMeters(leftFt) >= s1) continue;
			slots.push({ patternIndex: j, leftFt, leftM: feetToMeters(leftFt), rightM: feetToMeters(rightFt), pieces: [] });
		}
	}
	for (const slot of slots) {
		slot.pieces = clipToBand(plantedST, slot.leftM, slot.rightM).filter((piece) => shapeArea([piece]) >= SLIVER_M2);
	}

	const keptSlots = slots.map((s, k) => k).filter((k) => slots[k].pieces.length > 0);
	const kept = keptSlots.map((k) => slots[k]);
	const lanes: Lane[] = kept.map((slot, index) => {
		const spec = input.pattern[slot.patternIndex];
		const widthFt = widths[slot.patternIndex];
		const geometry = toGeometry(mapShape(slot.pieces, (p) => inverse(frame.fromST(p))));
		const acres = geodesicAcres(geometry);
		const rows = spec.rows ?? 0;
		const lane: Lane = {
			index,
			patternIndex: slot.patternIndex,
			kind: spec.kind,
			crop: spec.crop,
			widthFt,
			rows,
			offsetFt: slot.leftFt,
			geometry,
			acres,
			rowFeet: (rows * acres * SQ_FEET_PER_ACRE) / widthFt,
			borderRows: 0
		};
		const middle = openMiddleIn(spec);
		if (middle !== undefined) lane.openMiddleIn = middle;
		return lane;
	});
	countBorderRows(lanes, keptSlots);
	return lanes;
}


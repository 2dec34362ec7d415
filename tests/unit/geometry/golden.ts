import type { Layout } from '../../../src/lib/geometry/index';

/** Layout rounded for golden comparison: 1e-7° (≈ 1 cm) and 1e-4 ac. */
export function roundLayout(layout: Layout) {
	const r = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
	return {
		fieldAcres: r(layout.fieldAcres, 4),
		plantedAcres: r(layout.plantedAcres, 4),
		headlandAcres: r(layout.headlandAcres, 4),
		excludedAcres: r(layout.excludedAcres, 4),
		lanes: layout.lanes.map((l) => ({
			index: l.index, patternIndex: l.patternIndex, crop: l.crop, offsetFt: r(l.offsetFt, 6), acres: r(l.acres, 4),
			rowFeet: r(l.rowFeet, 0), borderRows: l.borderRows,
			coordinates: JSON.parse(JSON.stringify(l.geometry.coordinates, (_k, v) => (typeof v === 'number' ? r(v, 7) : v)))
		}))
	};
}

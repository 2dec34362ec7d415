import { layoutStrips } from '../../src/lib/geometry/index';
import { rectangleField, squareAround, travel, irregularField } from './fields';
const o: [number, number] = [-93.9, 44.1];
const section = rectangleField(o, 5280, 5280);
const ex = [squareAround(travel(travel(o, 0, 1000), 90, 1200), 300), squareAround(travel(travel(o, 0, 3000), 90, 4000), 500), squareAround(travel(travel(o, 0, 4500), 90, 2000), 200)];
const pattern = [{ kind: 'crop' as const, crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop' as const, crop: 'soybean', rows: 8, rowSpacingIn: 30 }];
for (let i = 0; i < 5; i++) {
	const t = performance.now();
	const L = layoutStrips({ boundary: section, exclusions: ex, guidance: { a: o, b: travel(o, 0, 5280) }, pattern, headlandFt: 30 });
	console.log('ms', (performance.now() - t).toFixed(1), L.lanes.length, L.fieldAcres.toFixed(4), L.plantedAcres, L.lanes.reduce((s, l) => s + l.acres, 0));
}
const big = irregularField([-96.5, 46.9], 8500, 400);
for (let i = 0; i < 3; i++) {
	const t = performance.now();
	const L = layoutStrips({ boundary: big, guidance: { a: [-96.5, 46.9], b: travel([-96.5, 46.9], 30, 1000) }, pattern, headlandFt: 40 });
	console.log('big ms', (performance.now() - t).toFixed(1), L.lanes.length, L.fieldAcres.toFixed(1), L.plantedAcres, L.lanes.reduce((s, l) => s + l.acres, 0), L.headlandAcres);
}

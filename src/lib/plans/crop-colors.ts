// Our own crop colours: distinct on screen and, with the lane numbers, in a grey printout. Crops that
// share a field in strips differ in lightness too (soybean dark, corn middle, small grains pale), so
// they stay apart for red-green colour blindness; lane kinds add a mark on the map.
const FIXED: Record<string, string> = {
	corn: '#d19a0f',
	soybean: '#3f7d20',
	soybeans: '#3f7d20',
	pasture: '#86b35b',
	wheat: '#e8c9a0',
	oats: '#f0e4b0',
	'cover mix': '#7a5ca8',
	cover: '#7a5ca8',
	buffer: '#8d8d8d'
};
const EXTRA = ['#1f6f8b', '#a23b72', '#5d4037', '#2e7d6b', '#9c6644', '#44546a'];

export function cropColor(crop: string): string {
	const key = crop.trim().toLowerCase();
	if (FIXED[key]) return FIXED[key];
	let h = 0;
	for (const c of key) h = (h * 31 + c.charCodeAt(0)) >>> 0;
	return EXTRA[h % EXTRA.length];
}

// Local stand-in for an XYZ map-tile service: draws a plain labelled grid as SVG, so the map has
// a background without any request leaving 127.0.0.1.
import http from 'node:http';

export function tileSvg(z: number, x: number, y: number): string {
	const shade = (x + y) % 2 === 0 ? '#eef0e6' : '#e6e9dc';
	const lines = [64, 128, 192]
		.map((p) => `<line x1="${p}" y1="0" x2="${p}" y2="256"/><line x1="0" y1="${p}" x2="256" y2="${p}"/>`)
		.join('');
	return `<svg xmlns="http://www.w3.org/2000/svg" width="256" height="256" viewBox="0 0 256 256">
<rect width="256" height="256" fill="${shade}"/>
<g stroke="#d3d7c4" stroke-width="1">${lines}</g>
<rect x="0.5" y="0.5" width="255" height="255" fill="none" stroke="#b9bea6"/>
<text x="6" y="16" font-family="sans-serif" font-size="10" fill="#8b917a">${z}/${x}/${y}</text>
</svg>`;
}

export async function startTileStandIn(opts: { host: string; port: number }) {
	const server = http.createServer((req, res) => {
		const m = (req.url ?? '').match(/^\/(\d{1,2})\/(\d+)\/(\d+)\.svg$/);
		if (!m) {
			res.writeHead(404, { 'content-type': 'text/plain' });
			return res.end('Tiles are at /{z}/{x}/{y}.svg');
		}
		const [z, x, y] = m.slice(1).map(Number);
		const n = 2 ** z;
		if (z > 22 || x >= n || y >= n) {
			res.writeHead(404, { 'content-type': 'text/plain' });
			return res.end('Tile outside the world');
		}
		res.writeHead(200, {
			'content-type': 'image/svg+xml',
			'cache-control': 'public, max-age=86400',
			'access-control-allow-origin': '*'
		});
		res.end(tileSvg(z, x, y));
	});
	await new Promise<void>((resolve, reject) => {
		server.once('error', reject);
		server.listen(opts.port, opts.host, () => resolve());
	});
	return { close: () => new Promise<void>((r) => server.close(() => r())) };
}

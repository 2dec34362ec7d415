// Headers every answer carries, plus the parts of the Content-Security-Policy that depend on how
// this copy is run (the policy itself comes from kit.csp in svelte.config.js).

/** One year; no includeSubDomains, since other sites may live beside the app on the same domain. */
export const HSTS = 'max-age=31536000';

/**
 * The CSP source for an XYZ tile template such as `https://{s}.tiles.example.test/{z}/{x}/{y}.png`,
 * or null when there is none or it is not http(s). A `{s}` subdomain becomes a `*.` wildcard.
 */
export function tileSource(tileUrl: string | null | undefined): string | null {
	if (!tileUrl) return null;
	const marker = 'tile-subdomain';
	let url: URL;
	try {
		url = new URL(tileUrl.replace('{s}', marker));
	} catch {
		return null;
	}
	if (url.protocol !== 'https:' && url.protocol !== 'http:') return null;
	return `${url.protocol}//${url.host.replace(marker, '*')}`;
}

/** Adds `source` to the policy's img-src directive (creating it when missing). */
export function allowImageSource(policy: string, source: string): string {
	const directives = policy.split(';').map((d) => d.trim()).filter(Boolean);
	const i = directives.findIndex((d) => d.split(/\s+/)[0] === 'img-src');
	if (i === -1) directives.push(`img-src ${source}`);
	else if (!directives[i].split(/\s+/).includes(source)) directives[i] = `${directives[i]} ${source}`;
	return directives.join('; ');
}

/**
 * Sets the fixed security headers on an answer, HSTS when the request came over https (directly or
 * as reported by the proxy through PROTOCOL_HEADER, which adapter-node folds into the URL), and the
 * tile host in img-src of a page's policy.
 */
export function applySecurityHeaders(headers: Headers, url: URL, tileUrl: string | null | undefined): void {
	headers.set('x-content-type-options', 'nosniff');
	headers.set('referrer-policy', 'same-origin');
	headers.set('x-frame-options', 'DENY');
	if (url.protocol === 'https:') headers.set('strict-transport-security', HSTS);
	const policy = headers.get('content-security-policy');
	const tiles = tileSource(tileUrl);
	if (policy && tiles) headers.set('content-security-policy', allowImageSource(policy, tiles));
}

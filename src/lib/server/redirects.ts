const FALLBACK = '/farms';
// Browsers drop tabs and newlines inside URLs and read a backslash as a slash, so "/\t/evil" or
// "/\evil" would turn into "//evil" (another host) after we had checked it.
const UNSAFE = /[\u0000-\u001f\u007f\\]/;
const BASE = 'http://stripwright.invalid';

/**
 * A same-origin path to go to after sign-in; anything else falls back to the farm list.
 * The value is parsed against a fixed origin and must keep that origin and start with one slash,
 * both as given and once percent-decoded.
 */
export function safeRedirectTarget(value: string | null | undefined): string {
	if (!value || !value.startsWith('/') || value.startsWith('//') || UNSAFE.test(value)) return FALLBACK;
	let decoded: string;
	try {
		decoded = decodeURIComponent(value);
	} catch {
		return FALLBACK;
	}
	if (decoded.startsWith('//') || UNSAFE.test(decoded)) return FALLBACK;
	let url: URL;
	try {
		url = new URL(value, BASE);
	} catch {
		return FALLBACK;
	}
	if (url.origin !== BASE || url.pathname.startsWith('//')) return FALLBACK;
	return url.pathname + url.search + url.hash;
}

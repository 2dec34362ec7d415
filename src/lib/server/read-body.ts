// Reads a request body into memory up to a limit, counting as it arrives, so a body that declares no
// length (chunked) is never buffered past the limit.

/**
 * The body's bytes, or null once it passes `limit` bytes. `whenOver` says what happens to the
 * stream then: 'release' leaves the socket open (so a 413 can still be sent on it), 'cancel' drops
 * the rest (right for a cloned copy, whose cancelling leaves the original untouched). Errors of the
 * stream itself (a client gone, the server's own size limit) are thrown to the caller.
 */
export async function readBodyUpTo(body: ReadableStream<Uint8Array> | null, limit: number, whenOver: 'release' | 'cancel'): Promise<Uint8Array<ArrayBuffer> | null> {
	if (!body) return new Uint8Array(0);
	const reader = body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > limit) {
			if (whenOver === 'cancel') void reader.cancel().catch(() => {});
			else reader.releaseLock();
			return null;
		}
		chunks.push(value);
	}
	const out = new Uint8Array(size);
	let at = 0;
	for (const c of chunks) {
		out.set(c, at);
		at += c.byteLength;
	}
	return out;
}

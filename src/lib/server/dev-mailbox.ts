// The dev mailbox shows reset and invitation links, so it must never be reachable from another
// machine: it exists only while the app listens on loopback and mail goes to the local stand-in.

const LOOPBACK_HOSTS = new Set(['127.0.0.1', '::1', '[::1]', 'localhost']);

/** True when the app only accepts connections from this machine. */
export function listensOnLoopback(env: Record<string, string | undefined>): boolean {
	// A unix socket is usually fronted by a proxy; adapter-node listens on 0.0.0.0 when HOST is unset.
	if (env.SOCKET_PATH) return false;
	return LOOPBACK_HOSTS.has((env.HOST ?? '').trim().toLowerCase());
}

/** The stand-in's reader address when the dev mailbox may be served, else null. */
export function devMailboxUrl(env: Record<string, string | undefined> = process.env): string | null {
	const url = env.MAILBOX_URL;
	if (!url || !/^http:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?$/.test(url)) return null;
	return listensOnLoopback(env) ? url : null;
}

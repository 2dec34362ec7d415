// Remembers results computed from versioned rows. A plan's id and version never come back with
// different lanes (every save makes a new version), so a key built from them is never stale and
// each app instance may keep its own copy: nothing to share, nothing to invalidate.
// Least recently used entries go first; a failed computation is not kept.

export interface VersionedMemo<T> {
	/** The value remembered under `key`, or the one `compute` gives (computed once for concurrent callers). */
	get(key: string, compute: () => Promise<T>): Promise<T>;
	readonly size: number;
}

export function versionedMemo<T>(limit = 200): VersionedMemo<T> {
	const entries = new Map<string, Promise<T>>();
	return {
		get(key, compute) {
			const hit = entries.get(key);
			if (hit) {
				// Map keeps insertion order: re-inserting marks the entry as the most recently used.
				entries.delete(key);
				entries.set(key, hit);
				return hit;
			}
			const value = compute();
			entries.set(key, value);
			value.catch(() => {
				if (entries.get(key) === value) entries.delete(key);
			});
			while (entries.size > limit) entries.delete(entries.keys().next().value as string);
			return value;
		},
		get size() {
			return entries.size;
		}
	};
}

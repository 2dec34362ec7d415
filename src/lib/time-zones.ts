// The IANA time zones a farm can choose, as this runtime knows them. Pure.
// Intl.supportedValuesOf leaves out "UTC" in some engines, so it is added by hand.
let zones: string[] | null = null;
let known: Set<string> | null = null;

/** Every zone the farm may be set to, sorted. */
export function timeZones(): string[] {
	if (!zones) zones = [...new Set([...Intl.supportedValuesOf('timeZone'), 'UTC'])].sort();
	return zones;
}

/** Whether `zone` is one of {@link timeZones} (exact spelling, as stored). */
export function isKnownTimeZone(zone: string): boolean {
	if (!known) known = new Set(timeZones());
	return known.has(zone);
}

/** Zones grouped by their region (the part before the first slash), for a select with groups. */
export function timeZoneGroups(list: string[] = timeZones()): { region: string; zones: string[] }[] {
	const groups = new Map<string, string[]>();
	for (const zone of list) {
		const region = zone.includes('/') ? zone.slice(0, zone.indexOf('/')) : 'Other';
		const g = groups.get(region) ?? [];
		g.push(zone);
		groups.set(region, g);
	}
	return [...groups].map(([region, zones]) => ({ region, zones }));
}

/** The zone's offset from UTC at `at`, e.g. "UTC−06:00", for labels. */
export function utcOffsetLabel(zone: string, at = new Date()): string {
	const part = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'longOffset' })
		.formatToParts(at)
		.find((p) => p.type === 'timeZoneName')?.value ?? 'GMT';
	const offset = part.replace('GMT', '');
	return `UTC${offset === '' ? '+00:00' : offset.replace('-', '−')}`;
}

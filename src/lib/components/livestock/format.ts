// Numbers and times on the livestock pages, with their units, in the farm's own clock.

export function num(n: number | null | undefined, digits = 1): string {
	if (n == null || !Number.isFinite(n)) return '—';
	return n.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

export const ft = (n: number) => `${Math.round(n).toLocaleString('en-US')} ft`;

export function stretchText(laneIndex: number, fromFt: number, toFt: number): string {
	return `Lane ${laneIndex + 1}, ${Math.round(fromFt).toLocaleString('en-US')}–${Math.round(toFt).toLocaleString('en-US')} ft`;
}

export function day(iso: string, timeZone: string): string {
	return new Intl.DateTimeFormat('en-US', { timeZone, month: 'short', day: 'numeric', year: 'numeric' }).format(new Date(iso));
}

export function dayTime(iso: string, timeZone: string): string {
	return new Intl.DateTimeFormat('en-US', { timeZone, month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' }).format(new Date(iso));
}

/** A move's span as a person says it: "Jun 1 – Jun 3" when it runs midnight to midnight. */
export function span(fromIso: string, toIso: string, timeZone: string): string {
	const midnight = (iso: string) => new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit', hourCycle: 'h23' }).format(new Date(iso)) === '00:00';
	if (midnight(fromIso) && midnight(toIso)) {
		const lastDay = new Date(Date.parse(toIso) - 1).toISOString();
		const a = day(fromIso, timeZone);
		const b = day(lastDay, timeZone);
		return a === b ? a : `${a} – ${b}`;
	}
	return `${dayTime(fromIso, timeZone)} – ${dayTime(toIso, timeZone)}`;
}

/** "Mar 5, 2027, 2:30 PM CST" in the farm's own clock, whatever the server's zone. */
export function formatInTimeZone(date: Date | string, timeZone: string): string {
	return new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit', timeZone, timeZoneName: 'short' }).format(new Date(date));
}

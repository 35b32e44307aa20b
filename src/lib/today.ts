/** Today's calendar date 'YYYY-MM-DD' in a time zone (the farm's), not the server's. */
export function todayIn(timeZone: string, now: Date = new Date()): string {
	// en-CA formats as YYYY-MM-DD.
	return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(now);
}

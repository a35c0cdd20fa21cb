/**
 * Timestamps in UTC with the zone named: custody records are read by people in different
 * places, and server and browser render the same text (no hydration mismatch).
 */
export function formatUtc(value: string | Date): string {
	const date = typeof value === 'string' ? new Date(value) : value;
	if (Number.isNaN(date.getTime())) return '—';
	return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

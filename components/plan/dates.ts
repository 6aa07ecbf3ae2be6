/** The ISO local date `days` after `isoDate` (calendar arithmetic in UTC, so no zone shifts it). */
export function addDaysLocal(isoDate: string, days: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** Today's date as YYYY-MM-DD (UTC): the day whose share set and readings count as current. */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** The first and last day of a calendar year. */
export function yearBounds(year: number): { from: string; to: string } {
  return { from: `${year}-01-01`, to: `${year}-12-31` };
}

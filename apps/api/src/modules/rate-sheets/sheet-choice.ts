export interface SheetCandidate {
  partyId: string | null;
  relationship: 'family' | 'neighbour' | 'agency';
  effectiveFrom: string;
}

export interface SheetChoice<T> {
  sheet: T;
  source: 'party-override' | 'relationship';
}

/** The item with the latest start on or before the date, among those that apply. */
function latestStarted<T>(items: readonly T[], keyOf: (item: T) => SheetCandidate, date: string): T | null {
  let best: T | null = null;
  for (const item of items) {
    const from = keyOf(item).effectiveFrom;
    if (from <= date && (best === null || from > keyOf(best).effectiveFrom)) best = item;
  }
  return best;
}

/**
 * The sheet that prices a party's work on a date: the party's own override sheet in force that day,
 * else the sheet of the party's relationship (family, neighbour, agency) in force that day.
 * Callers pass live (not archived) sheets only; `keyOf` reads the sheet out of whatever carries it.
 */
export function sheetInForce<T>(
  items: readonly T[],
  party: { id: string; relationship: SheetCandidate['relationship'] },
  date: string,
  keyOf: (item: T) => SheetCandidate,
): SheetChoice<T> | null {
  const override = latestStarted(
    items.filter((item) => keyOf(item).partyId === party.id),
    keyOf,
    date,
  );
  if (override !== null) return { sheet: override, source: 'party-override' };
  const general = latestStarted(
    items.filter((item) => keyOf(item).partyId === null && keyOf(item).relationship === party.relationship),
    keyOf,
    date,
  );
  return general !== null ? { sheet: general, source: 'relationship' } : null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const INSTANT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;
const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** "approvedAt" reads "Approved at", "paidByPartyId" reads "Paid by party": the log speaks the screen's words. */
export function fieldLabel(field: string): string {
  const words = field
    .replace(/Id$/, '')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** An id is shortened to its first block, the way a person compares two of them; an instant is shown in local time. */
export function valueText(value: string | null): string {
  if (value === null) return '—';
  if (UUID.test(value)) return `#${value.slice(0, 8)}`;
  if (INSTANT.test(value) && !Number.isNaN(Date.parse(value))) return when.format(new Date(value));
  return value;
}

// Dates and clock times as a person types them on their own phone, turned into what the API
// reads: calendar days as YYYY-MM-DD in local time, instants as ISO 8601 with the local offset.

const pad = (n: number) => String(n).padStart(2, '0');

/** The local calendar day, not the UTC one: an entry logged at 9 pm belongs to today. */
export function localDateIso(at: Date = new Date()): string {
  return `${at.getFullYear()}-${pad(at.getMonth() + 1)}-${pad(at.getDate())}`;
}

/** "HH:mm" of the local clock, as a time input shows it. */
export function localTimeOfDay(at: Date = new Date()): string {
  return `${pad(at.getHours())}:${pad(at.getMinutes())}`;
}

function offsetOf(at: Date): string {
  const minutes = -at.getTimezoneOffset();
  const sign = minutes >= 0 ? '+' : '-';
  const abs = Math.abs(minutes);
  return `${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}`;
}

/**
 * A local day and time of day ("2025-06-03", "07:30") as an instant with its offset
 * ("2025-06-03T07:30:00-05:00"); null when either part is missing or not a real time.
 */
export function localInstantIso(day: string, time: string): string | null {
  const d = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  const t = /^(\d{2}):(\d{2})$/.exec(time);
  if (!d || !t) return null;
  const at = new Date(Number(d[1]), Number(d[2]) - 1, Number(d[3]), Number(t[1]), Number(t[2]));
  if (Number.isNaN(at.getTime()) || at.getDate() !== Number(d[3]) || at.getHours() !== Number(t[1])) return null;
  return `${day}T${time}:00${offsetOf(at)}`;
}

/** Local "YYYY-MM-DD" and "HH:mm" parts of an instant the API sent. */
export function localParts(iso: string): { day: string; time: string } {
  const at = new Date(iso);
  return { day: localDateIso(at), time: localTimeOfDay(at) };
}

/** Monday to Sunday of the week holding `at`, as calendar days: the week a partner approves. */
export function weekOf(at: Date = new Date()): { from: string; to: string } {
  const monday = new Date(at.getFullYear(), at.getMonth(), at.getDate() - ((at.getDay() + 6) % 7));
  const sunday = new Date(monday.getFullYear(), monday.getMonth(), monday.getDate() + 6);
  return { from: localDateIso(monday), to: localDateIso(sunday) };
}

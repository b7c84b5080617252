/** Dates and times as the shop reads them: day month year, 24-hour clock, local time. */
const dateTime = new Intl.DateTimeFormat('en-GB', {
  day: '2-digit',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

export function formatDateTime(iso: string | null | undefined, never = 'never'): string {
  if (!iso) return never;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? never : dateTime.format(d);
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;
}

const day = new Intl.DateTimeFormat('en-GB', { day: '2-digit', month: 'short', year: 'numeric', timeZone: 'UTC' });

/** A calendar date (YYYY-MM-DD, no time of day) as "14 Mar 2026", the same in every time zone. */
export function formatDay(date: string | null | undefined, never = '—'): string {
  if (!date || !/^\d{4}-\d{2}-\d{2}/.test(date)) return never;
  const d = new Date(`${date.slice(0, 10)}T00:00:00Z`);
  return Number.isNaN(d.getTime()) ? never : day.format(d);
}

/** Today as YYYY-MM-DD in the browser's time zone. */
export function todayIso(now = new Date()): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${p(now.getMonth() + 1)}-${p(now.getDate())}`;
}

/** A YYYY-MM-DD date moved by whole days. */
export function addDaysIso(date: string, days: number): string {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** A byte count as B, kB or MB (decimal, as file managers show them). */
export function formatBytes(n: number): string {
  if (n < 1000) return `${n}\u00a0B`;
  if (n < 1_000_000) return `${(n / 1000).toFixed(1)}\u00a0kB`;
  return `${(n / 1_000_000).toFixed(1)}\u00a0MB`;
}

/** A count of units, the trade's way: "1,250 pcs" (a no-break space keeps the unit with its number). */
export const pieces = (n: number) => `${n.toLocaleString('en-US')}\u00a0pcs`;

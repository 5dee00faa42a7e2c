/** A server time (epoch milliseconds or an ISO string) as a `Date`, or `null` when it is not one. */
export function dateFrom(time: number | string | undefined | null): Date | null {
  if (time === undefined || time === null || time === '') return null;
  const date = new Date(typeof time === 'number' ? time : Date.parse(time));
  return Number.isFinite(date.getTime()) ? date : null;
}

const steps: ReadonlyArray<[Intl.RelativeTimeFormatUnit, number]> = [
  ['second', 60],
  ['minute', 60],
  ['hour', 24],
  ['day', 7],
  ['week', 4.345],
  ['month', 12],
  ['year', Infinity],
];

/** "just now", "5 minutes ago", "yesterday", "3 weeks ago". */
export function timeAgo(date: Date, now: Date = new Date(), locale = 'en'): string {
  let amount = (date.getTime() - now.getTime()) / 1000;
  if (Math.abs(amount) < 45) return 'just now';
  const format = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' });
  for (const [unit, size] of steps) {
    if (Math.abs(amount) < size) return format.format(Math.round(amount), unit);
    amount /= size;
  }
  return format.format(Math.round(amount), 'year');
}

/** "1 Dec 2026, 19:05" in the user's locale. */
export const dateTimeLabel = (date: Date): string =>
  date.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** Tick labels for the time axis of charts, in the user's locale. */

const DAY = 86_400;

/**
 * Time tick labels in the user's locale (uPlot's own are US-style): months for long spans, days
 * for weeks, clock times within a day; the year or date goes on a second line where it changes.
 */
export function timeTicks(splits: readonly number[], incr: number, locale?: string): string[] {
  const month = new Intl.DateTimeFormat(locale, { month: 'short' });
  const year = new Intl.DateTimeFormat(locale, { year: 'numeric' });
  const day = new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'numeric' });
  const clock = new Intl.DateTimeFormat(locale, { hour: '2-digit', minute: '2-digit' });
  let last = '';
  return splits.map((t) => {
    const d = new Date(t * 1000);
    const [main, outer] =
      incr >= 28 * DAY
        ? [month.format(d), year.format(d)]
        : incr >= DAY
          ? [day.format(d), year.format(d)]
          : [clock.format(d), day.format(d)];
    const label = outer === last ? main : `${main}\n${outer}`;
    last = outer;
    return label;
  });
}

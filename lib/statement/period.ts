/**
 * Water years and months for the season statement. Pure: dates are ISO local dates of the farm
 * ('2026-07-01'); nothing here reads a clock or a time zone.
 */

const pad2 = (n: number): string => String(n).padStart(2, "0");

/** The span of a statement: first and last local date, both included. */
export interface Period {
  from: string;
  to: string;
}

/**
 * The water year that starts on the 1st of `startMonth` (1-12) in `year` and ends the day before the
 * same date a year later (a calendar year when `startMonth` is 1).
 */
export function waterYearPeriod(year: number, startMonth: number): Period {
  const from = `${year}-${pad2(startMonth)}-01`;
  const end = new Date(Date.UTC(year + 1, startMonth - 1, 1) - 86_400_000);
  return { from, to: end.toISOString().slice(0, 10) };
}

/** The year in which the water year holding `isoDate` starts. */
export function waterYearOf(isoDate: string, startMonth: number): number {
  const year = Number(isoDate.slice(0, 4));
  const month = Number(isoDate.slice(5, 7));
  return month >= startMonth ? year : year - 1;
}

/** "2026" for a calendar water year, "2026-27" for one that runs into the next year. */
export function waterYearLabel(year: number, startMonth: number): string {
  return startMonth === 1 ? String(year) : `${year}-${pad2((year + 1) % 100)}`;
}

/** Every month ('YYYY-MM') that the span touches, in order. */
export function monthsOf(period: Period): string[] {
  const months: string[] = [];
  let y = Number(period.from.slice(0, 4));
  let m = Number(period.from.slice(5, 7));
  const last = period.to.slice(0, 7);
  for (;;) {
    const key = `${y}-${pad2(m)}`;
    if (key > last) break;
    months.push(key);
    m += 1;
    if (m > 12) {
      m = 1;
      y += 1;
    }
  }
  return months;
}

const MONTH_NAMES = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

/** 'Jul 2026' from '2026-07'. */
export function monthLabel(month: string): string {
  return `${MONTH_NAMES[Number(month.slice(5, 7)) - 1] ?? "?"} ${month.slice(0, 4)}`;
}

import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";

/** Today's ISO local date on the farm, in its own time zone. */
export function farmToday(timeZone: string, now: Date = new Date()): string {
  return format(new TZDate(now.getTime(), timeZone), "yyyy-MM-dd");
}

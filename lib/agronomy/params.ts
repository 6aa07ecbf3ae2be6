import { AppError } from "@/lib/api/errors";
import { isUuid } from "@/lib/auth/session";

/** A path id that must be a uuid; anything else is simply not found. */
export function pathId(value: string | undefined, noun: string): string {
  if (!value || !isUuid(value)) throw new AppError("not_found", `No such ${noun} on this farm.`);
  return value;
}

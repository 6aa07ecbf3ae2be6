/** Attempts before a delivery is given up (1 + 2 + 4 + 8 + 16 = 31 minutes of backoff in all; common practice, no source). */
export const MAX_ATTEMPTS = 6;

/** Minutes to wait before attempt `attempts + 1`: 1, 2, 4, 8, 16 … capped at an hour. */
export function backoffMinutes(attempts: number): number {
  return Math.min(60, 2 ** Math.max(0, attempts - 1));
}

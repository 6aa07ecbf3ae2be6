/**
 * The engine's one error: input that cannot describe a real field, day or storm.
 * `code` is stable so the API layer can map it to a 422; `field` names the offending input.
 */
export class WaterBalanceInputError extends Error {
  readonly code = "WATERBALANCE_INVALID_INPUT" as const;
  readonly field: string;

  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = "WaterBalanceInputError";
    this.field = field;
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(field: string, value: number): number {
  if (!Number.isFinite(value))
    throw new WaterBalanceInputError(field, `must be a finite number (got ${value})`);
  return value;
}

/** Throws unless `min <= value <= max`. */
export function requireRange(field: string, value: number, min: number, max: number): number {
  requireFinite(field, value);
  if (value < min || value > max) {
    throw new WaterBalanceInputError(field, `must be between ${min} and ${max} (got ${value})`);
  }
  return value;
}

/** Throws unless `value >= 0`. */
export function requireNonNegative(field: string, value: number): number {
  requireFinite(field, value);
  if (value < 0) throw new WaterBalanceInputError(field, `must not be negative (got ${value})`);
  return value;
}

/** Throws unless `value > 0`. */
export function requirePositive(field: string, value: number): number {
  requireFinite(field, value);
  if (value <= 0) throw new WaterBalanceInputError(field, `must be greater than zero (got ${value})`);
  return value;
}

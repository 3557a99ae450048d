/**
 * Thrown when an input is missing, malformed or physiologically implausible.
 * Clinical functions throw this rather than return a wrong value.
 * `field` names the offending input (the form can highlight it); `code` is a stable key.
 */
export type ClinicalInputErrorCode = "missing" | "invalid" | "out-of-range";

export class ClinicalInputError extends Error {
  readonly field: string;
  readonly code: ClinicalInputErrorCode;

  constructor(field: string, code: ClinicalInputErrorCode, message: string) {
    super(`${field}: ${message}`);
    this.name = "ClinicalInputError";
    this.field = field;
    this.code = code;
  }
}

/** A finite number within [min, max], else a ClinicalInputError. */
export function requireNumber(field: string, value: unknown, min: number, max: number): number {
  if (value === undefined || value === null || (typeof value === "string" && value.trim() === "")) {
    throw new ClinicalInputError(field, "missing", "a value is required");
  }
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new ClinicalInputError(field, "invalid", "must be a number");
  }
  if (value < min || value > max) {
    throw new ClinicalInputError(field, "out-of-range", `must be between ${min} and ${max}`);
  }
  return value;
}

export function optionalNumber(field: string, value: unknown, min: number, max: number): number | undefined {
  return value === undefined || value === null ? undefined : requireNumber(field, value, min, max);
}

export function requireOneOf<T extends string | number>(field: string, value: unknown, allowed: readonly T[]): T {
  if (value === undefined || value === null) {
    throw new ClinicalInputError(field, "missing", "a value is required");
  }
  if (!allowed.includes(value as T)) {
    throw new ClinicalInputError(field, "invalid", `must be one of ${allowed.join(", ")}`);
  }
  return value as T;
}

export function optionalOneOf<T extends string | number>(field: string, value: unknown, allowed: readonly T[]): T | undefined {
  return value === undefined || value === null ? undefined : requireOneOf(field, value, allowed);
}

export function requireBoolean(field: string, value: unknown): boolean {
  if (value === undefined || value === null) {
    throw new ClinicalInputError(field, "missing", "a value is required");
  }
  if (typeof value !== "boolean") throw new ClinicalInputError(field, "invalid", "must be true or false");
  return value;
}

export function optionalBoolean(field: string, value: unknown): boolean | undefined {
  return value === undefined || value === null ? undefined : requireBoolean(field, value);
}

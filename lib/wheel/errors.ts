/** Thrown for input the engine cannot compute with; `field` names the offending input. */
export class WheelInputError extends Error {
  readonly field: string;
  /** Every problem found, by field, when more than one input was checked at once. */
  readonly fieldErrors: Record<string, string[]>;

  constructor(field: string, message: string, fieldErrors?: Record<string, string[]>) {
    super(message);
    this.name = 'WheelInputError';
    this.field = field;
    this.fieldErrors = fieldErrors ?? { [field]: [message] };
  }
}

/** Throws unless `value` is a finite number, optionally inside [min, max]. Returns it for chaining. */
export function requireFinite(field: string, value: unknown, min = -Infinity, max = Infinity): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new WheelInputError(field, `${field} must be a finite number (got ${String(value)})`);
  }
  if (value < min || value > max) {
    const range = max === Infinity ? `at least ${min}` : min === -Infinity ? `at most ${max}` : `between ${min} and ${max}`;
    throw new WheelInputError(field, `${field} must be ${range} (got ${value})`);
  }
  return value;
}

/** Like requireFinite, for whole numbers. */
export function requireInteger(field: string, value: unknown, min = -Infinity, max = Infinity): number {
  requireFinite(field, value, min, max);
  if (!Number.isInteger(value)) {
    throw new WheelInputError(field, `${field} must be a whole number (got ${String(value)})`);
  }
  return value as number;
}

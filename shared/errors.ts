/** Raised by shared computations for input they cannot use; `field` names the offending argument. */
export class DomainError extends Error {
  constructor(
    readonly code: 'invalid_number' | 'invalid_geometry' | 'invalid_series' | 'invalid_date',
    message: string,
    readonly field?: string,
  ) {
    super(message)
    this.name = 'DomainError'
  }
}

export function assertFinite(
  value: number,
  field: string,
  opts: { min?: number; max?: number } = {},
): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new DomainError(
      'invalid_number',
      `${field} must be a finite number, got ${String(value)}.`,
      field,
    )
  }
  if (opts.min !== undefined && value < opts.min) {
    throw new DomainError(
      'invalid_number',
      `${field} must be at least ${opts.min}, got ${value}.`,
      field,
    )
  }
  if (opts.max !== undefined && value > opts.max) {
    throw new DomainError(
      'invalid_number',
      `${field} must be at most ${opts.max}, got ${value}.`,
      field,
    )
  }
}

/** Input that breaks a rule of the domain. The message is written for the person who typed the input. */
export class DomainError extends Error {
  /** The input field at fault, e.g. `nominalChargeKg` or `events[3].kg`, when there is one. */
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.name = 'DomainError';
    this.field = field;
  }
}

export function isDomainError(error: unknown): error is DomainError {
  return error instanceof DomainError;
}

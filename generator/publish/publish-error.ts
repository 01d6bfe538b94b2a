/**
 * Step: all of them (the one error type).
 * The one error type of the publishing step, and the code of a system error. `exitCode` follows the command-line contract:
 * 1 when the data would produce a wrong or unsafe publication (an archived page would change,
 * an id is not a slug), 2 when the request itself cannot be carried out (an output folder we
 * must not overwrite, another build holding the lock).
 */
export class PublishError extends Error {
  readonly exitCode: 1 | 2;
  constructor(message: string, exitCode: 1 | 2 = 1) {
    super(message);
    this.name = 'PublishError';
    this.exitCode = exitCode;
  }
}

/** The `code` of a Node system error (`ENOENT`, `EXDEV`, …), or undefined for any other value. */
export function errorCode(error: unknown): string | undefined {
  return typeof error === 'object' && error !== null && 'code' in error ? String((error as { code: unknown }).code) : undefined;
}

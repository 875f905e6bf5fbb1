/**
 * A file refused by the work on it (a limit passed, unreadable content). Plain data, so it crosses
 * from the worker thread to the server, where it becomes an HttpError with the same status.
 */
export class FileRefusal extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }

  toJSON(): { status: number; code: string; message: string; details?: unknown } {
    return {
      status: this.status,
      code: this.code,
      message: this.message,
      ...(this.details !== undefined ? { details: this.details } : {}),
    };
  }
}

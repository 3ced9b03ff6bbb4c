/**
 * The one error type of the server. Its message is shown to the user as it is, so it speaks their
 * words; internal detail goes to the log, never into an AppError.
 */
export class AppError extends Error {
  override name = 'AppError';

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }

  static badRequest(message: string, details?: unknown) {
    return new AppError(400, 'invalid_request', message, details);
  }
  static unauthenticated(message = 'Sign in to continue') {
    return new AppError(401, 'unauthenticated', message);
  }
  static forbidden(message = 'Your role does not allow this') {
    return new AppError(403, 'forbidden', message);
  }
  static notFound(message = 'Not found') {
    return new AppError(404, 'not_found', message);
  }
  static conflict(message: string, details?: unknown) {
    return new AppError(409, 'conflict', message, details);
  }
  static unprocessable(message: string, details?: unknown) {
    return new AppError(422, 'unprocessable', message, details);
  }
}

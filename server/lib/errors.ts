export class AppError extends Error {
  constructor(
    public code: string,
    public status: number,
    message: string,
    public details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) => new AppError('bad_request', 400, message, details);
export const validationError = (message: string, details?: unknown) => new AppError('validation_error', 400, message, details);
export const unauthenticated = (message = 'Sign in first') => new AppError('unauthenticated', 401, message);
export const forbidden = (message = 'Your role may not do this') => new AppError('forbidden', 403, message);
export const notFound = (what: string) => new AppError('not_found', 404, `${what} not found`);
export const conflict = (message: string) => new AppError('conflict', 409, message);

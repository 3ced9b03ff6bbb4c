import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiError } from '@emberline/contracts/errors';
import { DomainError } from '@emberline/domain/errors';
import { requestSavedAChange } from '../db/request-writes';
import { AppError } from '../http/app-error';

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
}

/** A lock SQLite enforced (db/triggers.ts): a change to a submitted inspection, in words. */
function fromLockTrigger(error: { code?: unknown; message?: unknown }): AppError | null {
  if (error.code !== 'SQLITE_CONSTRAINT_TRIGGER' || typeof error.message !== 'string') return null;
  if (!error.message.startsWith('locked: ')) return null;
  const words = error.message.slice('locked: '.length);
  return AppError.conflict(`${words.charAt(0).toUpperCase()}${words.slice(1)}.`);
}

// A disk (or quota) that is full, as the file system or SQLite says so.
const fullStorageCodes = new Set(['ENOSPC', 'EDQUOT', 'SQLITE_FULL']);

/** Errors thrown by body parsing and similar middleware, mapped into AppErrors. */
function fromMiddleware(error: HttpishError): AppError | null {
  const lock = fromLockTrigger(error as { code?: unknown; message?: unknown });
  if (lock) return lock;
  if (fullStorageCodes.has(String((error as { code?: unknown }).code)))
    return new AppError(
      507,
      'storage_full',
      "The server's storage is full: nothing of this request was kept. Tell your administrator, who can make room; what is stored already can still be read.",
    );
  if ((error as { code?: unknown }).code === 'STORAGE_UNAVAILABLE')
    return new AppError(
      503,
      'storage_unavailable',
      'The image store cannot be reached: nothing of this request was kept. Try again in a few minutes; if it goes on, tell your administrator.',
    );
  switch (error.type) {
    case 'entity.too.large':
      return new AppError(413, 'payload_too_large', 'The request is too large');
    case 'entity.parse.failed':
      return new AppError(400, 'invalid_json', 'The request body is not valid JSON');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new AppError(
        415,
        'unsupported_encoding',
        'The request uses an encoding the server does not read',
      );
    default: {
      const status = error.status ?? error.statusCode;
      if (status === 404) return AppError.notFound();
      if (error.expose && status && status >= 400 && status < 500) {
        return new AppError(status, 'invalid_request', 'The request could not be read');
      }
      return null;
    }
  }
}

/**
 * A domain rule broken: the path of the item at fault, and the message under the field the path
 * starts with, so that a form shows it where the user entered the value.
 */
function domainDetails(error: DomainError) {
  const field = error.path[0];
  return {
    path: error.path,
    fields: field === undefined ? {} : { [String(field)]: [error.message] },
    form: field === undefined ? [error.message] : [],
  };
}

/** The one error middleware: the contract's error shape with a request id, never a stack, SQL or path. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const known =
    error instanceof AppError
      ? error
      : error instanceof DomainError
        ? AppError.unprocessable(error.message, domainDetails(error))
        : fromMiddleware(error as HttpishError);
  const requestId = String(req.id ?? '');
  if (!known) {
    req.log.error({ err: error }, 'unhandled error');
  } else if (known.status >= 500) {
    req.log.error({ err: error }, known.message);
  }
  const appError =
    known ??
    new AppError(
      500,
      'internal_error',
      requestSavedAChange()
        ? `Something went wrong on the server after this request's change was saved: reload the page to see where things stand. If it happens again, give this reference to your administrator: ${requestId}`
        : `Something went wrong on the server. Nothing was changed by this request; if it happens again, give this reference to your administrator: ${requestId}`,
    );
  if (res.headersSent) {
    res.destroy();
    return;
  }
  for (const [name, value] of Object.entries(appError.headers ?? {})) res.setHeader(name, value);
  const body: ApiError = {
    error: {
      code: appError.code,
      message: appError.message,
      requestId,
      ...(appError.details === undefined ? {} : { details: appError.details }),
    },
  };
  res.status(appError.status).json(body);
};

/** Unmatched API paths answer in the error shape, not with the client's HTML. */
export const apiNotFound: RequestHandler = () => {
  throw AppError.notFound('There is no such API endpoint');
};

import type { ErrorRequestHandler, NextFunction, Request, RequestHandler, Response } from 'express';
import jwt from 'jsonwebtoken';
import { ZodError } from 'zod';
import { AppError, forbidden, unauthenticated } from './errors';
import { can, type Permission } from './permissions';
import type { Role } from '../db/models/user';
import { logger } from './logger';

const log = logger('http');

export interface AuthUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

declare module 'express-serve-static-core' {
  interface Request {
    user?: AuthUser;
  }
}

export interface TokenClaims {
  sub: string;
  email: string;
  name: string;
  role: Role;
}

export function verifyToken(token: string, secret: string): AuthUser {
  try {
    const claims = jwt.verify(token, secret, { algorithms: ['HS256'] }) as TokenClaims;
    return { id: Number(claims.sub), email: claims.email, name: claims.name, role: claims.role };
  } catch (err) {
    const expired = err instanceof jwt.TokenExpiredError;
    throw unauthenticated(expired ? 'Your session has expired: sign in again' : 'Invalid token: sign in again');
  }
}

/** Checks the bearer token; the user's current role and active flag are checked against the database by `loadUser`. */
export function requireAuth(secret: string, loadUser: (id: number) => Promise<AuthUser | null>): RequestHandler {
  return async (req, _res, next) => {
    const header = req.headers.authorization ?? '';
    const m = /^Bearer (.+)$/.exec(header);
    if (!m) return next(unauthenticated());
    try {
      const claims = verifyToken(m[1], secret);
      const user = await loadUser(claims.id);
      if (!user) return next(unauthenticated('This account is no longer active'));
      req.user = user;
      next();
    } catch (err) {
      next(err);
    }
  };
}

export const requirePermission =
  (permission: Permission): RequestHandler =>
  (req, _res, next) => {
    if (!req.user) return next(unauthenticated());
    if (!can(req.user.role, permission)) return next(forbidden());
    next();
  };

export const errorHandler: ErrorRequestHandler = (err, req: Request, res: Response, _next: NextFunction) => {
  if (err instanceof ZodError) {
    res.status(400).json({
      error: {
        code: 'validation_error',
        message: err.issues.map((i) => `${i.path.join('.') || 'body'}: ${i.message}`).join('; '),
        details: err.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
      },
    });
    return;
  }
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } });
    return;
  }
  // body-parser errors carry a status and a type.
  const status = typeof err?.status === 'number' ? err.status : 500;
  if (status >= 400 && status < 500) {
    const code = err.type === 'entity.too.large' ? 'payload_too_large' : 'bad_request';
    res.status(status).json({ error: { code, message: err.type === 'entity.parse.failed' ? 'The body is not valid JSON' : String(err.message) } });
    return;
  }
  log.error({ err, path: req.path }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged' } });
};

export const notFoundHandler: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No route ${req.method} ${req.path}` } });
};

import { Router } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { login } from './service';
import type { AppContext } from '../../lib/context';

const LoginBody = z.object({ email: z.string().trim().email().max(254), password: z.string().min(1).max(200) });

export function loginRoutes(ctx: AppContext) {
  const r = Router();
  // Slows password guessing: a few attempts per address and e-mail in a quarter of an hour.
  const limiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: ctx.config.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').toLowerCase()}`,
    skipSuccessfulRequests: true,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many sign-in attempts: wait a quarter of an hour and try again' } });
    },
  });
  r.post('/login', limiter, async (req, res) => {
    const body = LoginBody.parse(req.body);
    res.json(await login(body.email, body.password, ctx.jwtSecret, ctx.config.JWT_TTL_SECONDS));
  });
  return r;
}

export function meRoutes() {
  const r = Router();
  r.get('/me', (req, res) => {
    res.json({ user: req.user });
  });
  return r;
}

import type { Request, Response } from 'express';
import { rateLimit, type RateLimitRequestHandler } from 'express-rate-limit';
import type { HttpErrorBody } from '../common/http-error.js';

/** A per-address limiter answering in the API's one error shape (429, retry time in details). */
export function limiter(what: string, limit: number, windowS: number): RateLimitRequestHandler {
  return rateLimit({
    windowMs: windowS * 1000,
    limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req: Request, res: Response) => {
      const body: HttpErrorBody = {
        statusCode: 429,
        error: 'Too Many Requests',
        message: `Too many ${what} attempts from this address; try again in ${windowS} s at the latest`,
        details: { limit, windowS },
      };
      res.status(429).json(body);
    },
  });
}

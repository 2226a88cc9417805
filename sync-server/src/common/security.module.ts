import { type DynamicModule, Global, Inject, Logger, type MiddlewareConsumer, Module, type NestModule, RequestMethod } from '@nestjs/common';
import cors from 'cors';
import type { NextFunction, Request, Response } from 'express';
import { ACCOUNTS_CONFIG, type AccountsConfig } from './accounts-config.js';

const ALL = { path: '{*path}', method: RequestMethod.ALL };

/** One line per request at `verbose` level: method, path without the query string, status, time. */
function accessLog(logger: Logger) {
  return (req: Request, res: Response, next: NextFunction) => {
    const t0 = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - t0) / 1e6;
      logger.verbose(`${req.method} ${req.originalUrl.split('?')[0]} ${res.statusCode} ${ms.toFixed(1)}ms`);
    });
    next();
  };
}

/**
 * Holds the AccountsConfig for every module and applies the cross-cutting middleware: CORS limited
 * to the configured origins (credentials not needed: tokens travel in the Authorization header) and
 * the access log. Security headers and body limits are set in createApp() (app.ts).
 */
@Global()
@Module({})
export class SecurityModule implements NestModule {
  static register(config: AccountsConfig): DynamicModule {
    return {
      module: SecurityModule,
      providers: [{ provide: ACCOUNTS_CONFIG, useValue: config }],
      exports: [ACCOUNTS_CONFIG],
    };
  }

  constructor(@Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig) {}

  configure(consumer: MiddlewareConsumer): void {
    const origins = new Set(this.config.corsOrigins);
    consumer
      .apply(
        accessLog(new Logger('Http')),
        cors({
          origin: (origin, done) => done(null, origin !== undefined && origins.has(origin)),
          methods: ['GET', 'POST', 'PATCH', 'PUT', 'DELETE'],
          allowedHeaders: ['Authorization', 'Content-Type'],
          maxAge: 600,
        }),
      )
      .forRoutes(ALL);
  }
}

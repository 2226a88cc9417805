import { type DynamicModule, Logger, Module } from '@nestjs/common';
import { ConfigModule, ConfigService, registerAs } from '@nestjs/config';
import { SequelizeModule } from '@nestjs/sequelize';
import { ServeStaticModule } from '@nestjs/serve-static';
import fs from 'node:fs';
import path from 'node:path';
import type { AppConfig } from './config/app-config.js';
import { MODELS } from './database/models.js';
import { sequelizeOptions } from './database/sequelize-options.js';
import { HealthModule } from './health/health.module.js';
import { AuthModule } from './auth/auth.module.js';
import { loadAccountsConfig } from './common/accounts-config.js';
import { ACCOUNT_MODELS } from './common/account-models.js';
import { SecurityModule } from './common/security.module.js';
import { MailModule } from './mail/mail.module.js';
import { MembershipsModule } from './memberships/memberships.module.js';
import { ProjectsModule } from './projects/projects.module.js';
import { UsersModule } from './users/users.module.js';
import { MapsModule } from './maps/maps.module.js';
import { SyncModule } from './sync/sync.module.js';
import { ReviewsModule } from './reviews/reviews.module.js';
import { SpotChecksModule } from './spot-checks/spot-checks.module.js';
import { ExportsModule } from './exports/exports.module.js';
import { UploadsModule } from './uploads/uploads.module.js';

export const appConfig = (config: AppConfig) => registerAs('app', () => config);


/** Paths under /api never fall back to the PWA's index.html: they get the JSON 404. */
const API_PATHS = /^\/api(\/|$)/;

@Module({})
export class AppModule {
  /** The whole app for one configuration (tests build several side by side). */
  static register(config: AppConfig): DynamicModule {
    const accounts = config.accounts ?? loadAccountsConfig(config);
    const imports: DynamicModule['imports'] = [
      ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [appConfig(config)] }),
      SequelizeModule.forRootAsync({
        inject: [ConfigService],
        useFactory: (cs: ConfigService) => {
          const options = sequelizeOptions(cs.getOrThrow<AppConfig>('app').db);
          return { ...options, models: [...MODELS, ...ACCOUNT_MODELS] };
        },
      }),
      HealthModule,
      // Accounts, sign-in, projects, members, invitations, mail (the JWT guard is app-wide: see AuthModule).
      SecurityModule.register(accounts),
      UsersModule,
      AuthModule,
      MailModule,
      ProjectsModule,
      MembershipsModule,
      // Map sync, reviews, spot-checks, uploads, exports.
      MapsModule,
      SyncModule,
      SpotChecksModule,
      ReviewsModule,
      ExportsModule,
      UploadsModule,
    ];
    if (fs.existsSync(path.join(config.pwaDist, 'index.html'))) {
      // Static files first; any other GET outside /api gets index.html (client-side routes).
      imports.push(ServeStaticModule.forRoot({ rootPath: config.pwaDist, exclude: API_PATHS }));
    } else {
      new Logger('AppModule').warn(
        `No built PWA at ${config.pwaDist}; only the API is served (run \`npm run build -w pwa\`).`,
      );
    }
    return { module: AppModule, imports };
  }
}

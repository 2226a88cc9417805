import { type DynamicModule, Logger, Module } from '@nestjs/common';
import { ConfigModule, ConfigService, registerAs } from '@nestjs/config';
import { SequelizeModule } from '@nestjs/sequelize';
import { ServeStaticModule } from '@nestjs/serve-static';
import fs from 'node:fs';
import path from 'node:path';
import type { AppConfig } from './config/app-config.js';
import { sequelizeOptions } from './database/sequelize-options.js';
import { HealthModule } from './health/health.module.js';

export const appConfig = (config: AppConfig) => registerAs('app', () => config);

/** Paths under /api never fall back to the PWA's index.html: they get the JSON 404. */
const API_PATHS = /^\/api(\/|$)/;

@Module({})
export class AppModule {
  /** The whole app for one configuration (tests build several side by side). */
  static register(config: AppConfig): DynamicModule {
    const imports: DynamicModule['imports'] = [
      ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [appConfig(config)] }),
      SequelizeModule.forRootAsync({
        inject: [ConfigService],
        useFactory: (cs: ConfigService) => sequelizeOptions(cs.getOrThrow<AppConfig>('app').db),
      }),
      HealthModule,
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

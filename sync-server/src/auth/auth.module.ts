import { type MiddlewareConsumer, Module, type NestModule, RequestMethod, Inject } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { SequelizeModule } from '@nestjs/sequelize';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import { MailModule } from '../mail/mail.module.js';
import { UsersModule } from '../users/users.module.js';
import { AuthController } from './auth.controller.js';
import { AuthService } from './auth.service.js';
import { JwtAuthGuard } from './jwt-auth.guard.js';
import { JwtStrategy } from './jwt.strategy.js';
import { PasswordReset } from './models/password-reset.model.js';
import { RefreshToken } from './models/refresh-token.model.js';
import { PasswordHasher } from './password-hasher.js';
import { limiter } from './rate-limits.js';
import { TokensService } from './tokens.service.js';

@Module({
  imports: [
    UsersModule,
    MailModule,
    PassportModule,
    SequelizeModule.forFeature([RefreshToken, PasswordReset]),
    JwtModule.registerAsync({
      inject: [ACCOUNTS_CONFIG],
      useFactory: (config: AccountsConfig) => ({ secret: config.jwtSecret, signOptions: { algorithm: 'HS256' } }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    TokensService,
    PasswordHasher,
    JwtStrategy,
    // Every route needs a valid access token unless it is marked @Public().
    { provide: APP_GUARD, useClass: JwtAuthGuard },
  ],
  exports: [TokensService, PasswordHasher, JwtModule],
})
export class AuthModule implements NestModule {
  constructor(@Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig) {}

  /** Rate limits (express-rate-limit; @nestjs/throttler does not load under Jest on Node 20). */
  configure(consumer: MiddlewareConsumer): void {
    const { windowS, signIn, register, reset } = this.config.rateLimit;
    const post = (path: string) => ({ path, method: RequestMethod.POST });
    consumer.apply(limiter('sign-in', signIn, windowS)).forRoutes(post('auth/sign-in'));
    consumer.apply(limiter('registration', register, windowS)).forRoutes(post('auth/register'), post('invitations/accept'));
    consumer.apply(limiter('password reset', reset, windowS)).forRoutes(post('auth/password/forgot'), post('auth/password/reset'));
  }
}

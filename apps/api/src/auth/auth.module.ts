import { Module } from '@nestjs/common';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { ENV, type Env } from '../config/env.js';
import { AuthController } from './auth.controller.js';
import { AuthService } from './auth.service.js';
import { JwtStrategy } from './jwt.strategy.js';
import { SESSION_ALGORITHM } from './session-user.js';
import { SignInThrottlerGuard, signInThrottlers } from './sign-in-throttler.guard.js';

@Module({
  imports: [
    PassportModule,
    JwtModule.registerAsync({
      inject: [ENV],
      useFactory: (env: Env) => ({
        secret: env.JWT_SECRET,
        signOptions: { expiresIn: env.SESSION_TTL_S, algorithm: SESSION_ALGORITHM },
      }),
    }),
    // Only the sign-in route uses the throttler guard (see SignInThrottlerGuard).
    ThrottlerModule.forRootAsync({
      inject: [ENV],
      useFactory: (env: Env) => signInThrottlers(env.SIGN_IN_LIMIT_PER_MINUTE, env.SIGN_IN_ADDRESS_LIMIT_PER_MINUTE),
    }),
  ],
  controllers: [AuthController],
  providers: [AuthService, JwtStrategy, SignInThrottlerGuard],
  exports: [AuthService, SignInThrottlerGuard],
})
export class AuthModule {}

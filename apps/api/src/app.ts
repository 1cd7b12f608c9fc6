import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import type { INestApplication, LogLevel } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import cookieParser from 'cookie-parser';
import swaggerUi from 'swagger-ui-dist';
import express, { type NextFunction, type Request, type Response } from 'express';
import { AppModule } from './app.module.js';
import type { Env } from './config/env.js';

const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self'",
  "object-src 'none'",
  "frame-src 'self' blob:",
  "frame-ancestors 'none'",
  "base-uri 'self'",
  "form-action 'self'",
].join('; ');

/**
 * Builds the whole app (used by main.ts and by the API and browser tests alike): every route
 * under /api, JSON 404 for unknown /api paths, and the built web app from the same origin.
 */
export async function createApp(env: Env, options: { logger?: false | LogLevel[] } = {}): Promise<INestApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(env), {
    logger: options.logger ?? ['error', 'warn'],
    bodyParser: true,
  });
  app.setGlobalPrefix('api');
  app.use(cookieParser());
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use((_req: Request, res: Response, next: NextFunction) => {
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Referrer-Policy', 'same-origin');
    // Scripts only from our own origin; inline styles are allowed because Blueprint and the charts set them.
    res.setHeader('Content-Security-Policy', CONTENT_SECURITY_POLICY);
    next();
  });
  app.enableShutdownHooks();

  // Unknown routes under /api fall through to Nest's JSON 404 (via the exception filter), never the web app.
  const expressApp = app.getHttpAdapter().getInstance() as express.Express;
  if (env.NODE_ENV !== 'production') {
    expressApp.use('/api/docs/assets', express.static(swaggerUi.getAbsoluteFSPath(), { index: false }));
  }
  if (env.WEB_DIST && fs.existsSync(path.join(env.WEB_DIST, 'index.html'))) {
    const indexHtml = path.join(env.WEB_DIST, 'index.html');
    expressApp.use(express.static(env.WEB_DIST, { index: false, maxAge: '1h' }));
    // Client-side routes (everything outside /api) get the app's index.html.
    expressApp.get(/^(?!\/api(\/|$)).*/, (_req: Request, res: Response) => res.sendFile(indexHtml));
  }
  await app.init();
  return app;
}

import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import type { INestApplication } from '@nestjs/common';
import type { DestinationStream } from 'pino';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import cookieParser from 'cookie-parser';
import express, { type Request, type Response } from 'express';
import { AppModule } from './app.module.js';
import type { Env } from './config/env.js';
import { sameOriginWrites } from './http-security/same-origin-writes.js';
import { securityHeaders } from './http-security/security-headers.js';
import { createLogger, httpLogger, PinoNestLogger } from './logging/logger.js';
import { webAssets } from './web-assets/web-assets.js';

/**
 * Builds the whole app (used by main.ts and by the API and browser tests alike): every route
 * under /api, JSON 404 for unknown /api paths, and the built web app from the same origin.
 */
export async function createApp(
  env: Env,
  options: { logger?: false; logStream?: DestinationStream } = {},
): Promise<INestApplication> {
  const logger = createLogger(options.logger === false ? 'silent' : env.LOG_LEVEL, options.logStream);
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(env), {
    logger: new PinoNestLogger(logger),
    bodyParser: true,
  });
  // First, so every later line and every error reply carries the request id.
  app.use(httpLogger(logger));
  app.setGlobalPrefix('api');
  app.use(cookieParser());
  app.disable('x-powered-by');
  // Client addresses (sign-in throttling) and https (HSTS, Secure cookie) come from X-Forwarded-*
  // only when a proxy in front is trusted explicitly; otherwise anyone could claim any address.
  app.set('trust proxy', env.TRUST_PROXY);
  app.set('etag', false);
  // The web's page, read once: the CSP allows its inline script by hash, and it is what is served.
  const indexHtml = env.WEB_DIST ? path.join(env.WEB_DIST, 'index.html') : null;
  const pageHtml = indexHtml && fs.existsSync(indexHtml) ? fs.readFileSync(indexHtml, 'utf8') : undefined;
  app.use(securityHeaders({ pageHtml }));
  app.use(sameOriginWrites(env.EXTRA_ORIGINS));
  app.enableShutdownHooks();

  // Unknown routes under /api fall through to Nest's JSON 404 (via the exception filter), never the web app.
  const expressApp = app.getHttpAdapter().getInstance();
  if (env.NODE_ENV !== 'production') {
    // Loaded only here: the package's main module also evaluates Swagger UI's 2 MB of browser
    // bundles, which a production API (no /api/docs) would keep in its heap for nothing.
    const { default: swaggerUi } = await import('swagger-ui-dist');
    expressApp.use('/api/docs/assets', express.static(swaggerUi.getAbsoluteFSPath(), { index: false }));
  }
  if (env.WEB_DIST && pageHtml !== undefined) {
    expressApp.use(webAssets(env.WEB_DIST));
    // Client-side routes (everything outside /api) get the app's index.html: the bytes read at
    // start, whose inline script the CSP names, not whatever the file holds later.
    // Compressed once, here, like the built assets are at build time.
    const page = {
      identity: Buffer.from(pageHtml, 'utf8'),
      br: brotliCompressSync(pageHtml),
      gzip: gzipSync(pageHtml),
    };
    expressApp.get(/^(?!\/api(\/|$)).*/, (req: Request, res: Response) => {
      // Brotli whenever accepted (browsers list gzip first), as express-static-gzip does for the assets.
      const encoding = req.acceptsEncodings('br') ? 'br' : req.acceptsEncodings('gzip') ? 'gzip' : 'identity';
      res.setHeader('Cache-Control', 'no-cache');
      res.setHeader('Vary', 'Accept-Encoding');
      if (encoding !== 'identity') res.setHeader('Content-Encoding', encoding);
      res.type('html').send(page[encoding]);
    });
  }
  await app.init();
  return app;
}

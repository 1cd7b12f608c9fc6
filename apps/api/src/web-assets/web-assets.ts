import path from 'node:path';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import expressStaticGzip from 'express-static-gzip';

/** Vite's output under assets/ carries a content hash in each name: it never changes under that name. */
const HASHED = `${path.sep}assets${path.sep}`;

/**
 * The built web app: brotli or gzip files made at build time (vite-plugin-compression2) when the
 * browser accepts them; hashed files cached for a year as immutable, everything else revalidated.
 * Requests under /api never reach the disk here.
 */
export function webAssets(webDist: string): RequestHandler {
  const serve = expressStaticGzip(webDist, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      setHeaders: (res, file) =>
        res.setHeader(
          'Cache-Control',
          file.includes(HASHED) ? 'public, max-age=31536000, immutable' : 'public, max-age=0, must-revalidate',
        ),
    },
  });
  return (req: Request, res: Response, next: NextFunction) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    return serve(req, res, next);
  };
}

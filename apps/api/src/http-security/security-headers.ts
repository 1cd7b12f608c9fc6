import type { NextFunction, Request, RequestHandler, Response } from 'express';
import helmet from 'helmet';

/** Scripts only from our own origin; inline styles are allowed because Blueprint and the charts set them. */
const CONTENT_SECURITY_POLICY = {
  useDefaults: false,
  directives: {
    defaultSrc: ["'self'"],
    scriptSrc: ["'self'"],
    styleSrc: ["'self'", "'unsafe-inline'"],
    imgSrc: ["'self'", 'data:', 'blob:'],
    fontSrc: ["'self'", 'data:'],
    connectSrc: ["'self'"],
    objectSrc: ["'none'"],
    frameSrc: ["'self'", 'blob:'],
    frameAncestors: ["'none'"],
    baseUri: ["'self'"],
    formAction: ["'self'"],
  },
};

const hsts = helmet.strictTransportSecurity({ maxAge: 31_536_000, includeSubDomains: true });

/**
 * The security headers of every reply, from helmet (maintained with the browsers' changes rather
 * than by hand). HSTS only on replies served over HTTPS (directly, or behind a proxy trusted with
 * TRUST_PROXY): over plain HTTP it means nothing and would pin a loopback development host.
 * Every /api reply carries patient data or may: `Cache-Control: no-store`, no ETag revalidation.
 */
export function securityHeaders(): RequestHandler[] {
  return [
    helmet({
      contentSecurityPolicy: CONTENT_SECURITY_POLICY,
      strictTransportSecurity: false,
      referrerPolicy: { policy: 'same-origin' },
    }),
    (req: Request, res: Response, next: NextFunction) => (req.secure ? hsts(req, res, next) : next()),
    (req: Request, res: Response, next: NextFunction) => {
      if (req.path === '/api' || req.path.startsWith('/api/')) res.setHeader('Cache-Control', 'no-store');
      next();
    },
  ];
}

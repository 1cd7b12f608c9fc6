// The page's inline scripts are allowed by hash (CSP Level 2: sha256 of the script's text, exactly
// as served, base64). A script that changes by one character is no longer allowed.
import { IncomingMessage, ServerResponse } from 'node:http';
import { Socket } from 'node:net';
import type { Request, RequestHandler, Response } from 'express';
import helmet from 'helmet';
import { describe, expect, it } from 'vitest';
import { inlineScriptSources, recordHeaders, securityHeaders } from './security-headers.js';

describe('inlineScriptSources', () => {
  it("hashes each inline script's text as CSP expects it", () => {
    // sha256("alert(1)"), base64: a fixed vector, not recomputed here.
    expect(inlineScriptSources('<head><script>alert(1)</script></head>')).toEqual([
      "'sha256-bhHHL3z2vDgxUt0W3dWQOrprscmda2Y5pLsLg4GF+pI='",
    ]);
  });

  it('differs when the script differs by one character', () => {
    const [one] = inlineScriptSources('<script>alert(1)</script>');
    const [two] = inlineScriptSources('<script>alert(2)</script>');
    expect(one).not.toBe(two);
  });

  it('leaves out scripts loaded from a file, and finds every inline one', () => {
    const html =
      '<script type="module" crossorigin src="/assets/index.js"></script>' +
      '<script>first()</script><p>text</p><script type="text/javascript">\nsecond()\n</script>';
    expect(inlineScriptSources(html)).toHaveLength(2);
    expect(inlineScriptSources('<html><head></head></html>')).toEqual([]);
  });
});

// The headers are worked out once at start (recordHeaders) and replayed on every reply: they must
// be exactly what helmet itself sets on a reply, header for header, or the replay changed them.
describe('securityHeaders', () => {
  const page = '<head><script>early()</script></head>';
  const reply = (url: string, secure = false) => {
    // Express's own getters (path, secure) as plain values: the handler reads nothing else of the request.
    const req = Object.assign(new IncomingMessage(new Socket()), { url, path: url, secure, method: 'GET' });
    const res = new ServerResponse(req);
    res.setHeader('X-Powered-By', 'Express');
    return { req, res };
  };
  const run = (handler: RequestHandler, url: string, secure = false) => {
    const { req, res } = reply(url, secure);
    let nexts = 0;
    void handler(req as unknown as Request, res as unknown as Response, () => (nexts += 1));
    expect(nexts).toBe(1);
    return res.getHeaders();
  };
  const helmetItself = (secure: boolean) =>
    [
      helmet({
        contentSecurityPolicy: {
          useDefaults: false,
          directives: {
            defaultSrc: ["'self'"],
            scriptSrc: ["'self'", ...inlineScriptSources(page)],
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
        },
        strictTransportSecurity: false,
        referrerPolicy: { policy: 'same-origin' },
      }),
      ...(secure ? [helmet.strictTransportSecurity({ maxAge: 31_536_000, includeSubDomains: true })] : []),
    ]
      .reduce((res, middleware) => {
        middleware({} as Request, res, () => {});
        return res;
      }, reply('/').res)
      .getHeaders();

  it('sets on every reply exactly the headers helmet sets, computed once', () => {
    const handler = securityHeaders({ pageHtml: page });
    const web = run(handler, '/sites/1');
    expect(web).toEqual(helmetItself(false));
    expect(web['x-powered-by']).toBeUndefined();
    expect(String(web['content-security-policy'])).toContain(inlineScriptSources(page)[0]);
    // The same headers on the next reply: nothing consumed or changed by the first.
    expect(run(handler, '/sites/2')).toEqual(web);
  });

  it('adds HSTS over HTTPS only, and no-store on /api replies only', () => {
    const handler = securityHeaders({ pageHtml: page });
    expect(run(handler, '/api/sites', true)).toEqual({ ...helmetItself(true), 'cache-control': 'no-store' });
    expect(run(handler, '/', true)['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
    expect(run(handler, '/api', false)['strict-transport-security']).toBeUndefined();
    expect(run(handler, '/apis/x', false)['cache-control']).toBeUndefined();
  });

  it('refuses, at start, a helmet that reports an error instead of setting headers', () => {
    expect(() => recordHeaders((_req, _res, next) => next(new Error('bad directive')))).toThrow('bad directive');
  });
});

// The request's log line: the fields operators read (req.id, req.method, req.path, res.statusCode,
// responseTime, msg) at the levels they filter on, as pino-http wrote them before session 11; and
// no child logger for a request whose line is not written (what the change saves).
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createLogger, httpLogger } from './logger.js';

let close: (() => Promise<void>) | null = null;
afterEach(async () => {
  await close?.();
  close = null;
});

/** A server whose every request goes through httpLogger and then `handle`; the lines it logged. */
async function serve(level: string, handle: (req: IncomingMessage, res: ServerResponse) => void) {
  const lines: Record<string, unknown>[] = [];
  const logger = createLogger(level, { write: (line: string) => void lines.push(JSON.parse(line)) });
  const middleware = httpLogger(logger);
  const server = createServer((req, res) => middleware(req, res, () => handle(req, res)));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  close = () => new Promise((resolve) => server.close(() => resolve()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return { lines, logger, url };
}

const reply = (status: number) => (_req: IncomingMessage, res: ServerResponse) => {
  res.statusCode = status;
  res.end('{}');
};

/** The line's fields but its clock (time, responseTime: checked to be numbers). */
const fields = (line: Record<string, unknown>) => {
  expect(typeof line.time).toBe('number');
  expect(typeof line.responseTime).toBe('number');
  const { time: _time, responseTime: _took, pid: _pid, hostname: _host, ...rest } = line;
  return rest;
};

describe('httpLogger', () => {
  it('writes one line per request with its id, method, path without the query, status and time', async () => {
    const { lines, url } = await serve('debug', reply(200));
    const res = await fetch(`${url}/api/patients?q=Achterberg`);
    await res.arrayBuffer();
    await vi.waitFor(() => expect(lines).toHaveLength(1));
    const id = res.headers.get('x-request-id');
    expect(id).toMatch(/^[0-9a-f-]{36}$/);
    expect(fields(lines[0])).toEqual({
      level: 20,
      service: 'torquetrail-api',
      req: { id, method: 'GET', path: '/api/patients' },
      res: { statusCode: 200 },
      msg: 'request completed',
    });
    expect(JSON.stringify(lines)).not.toContain('Achterberg');
  });

  it('logs refusals at info and failures at error, with the error pino-http named', async () => {
    let status = 404;
    const { lines, url } = await serve('info', (req, res) => reply(status)(req, res));
    await (await fetch(`${url}/api/sites/x`, { headers: { 'x-request-id': 'lb-7f3a9c21' } })).arrayBuffer();
    status = 500;
    await (await fetch(`${url}/api/sites/y`, { method: 'POST' })).arrayBuffer();
    await vi.waitFor(() => expect(lines).toHaveLength(2));
    expect(fields(lines[0])).toEqual({
      level: 30,
      service: 'torquetrail-api',
      req: { id: 'lb-7f3a9c21', method: 'GET', path: '/api/sites/x' },
      res: { statusCode: 404 },
      msg: 'request completed',
    });
    const failed = fields(lines[1]);
    expect(failed).toMatchObject({
      level: 50,
      req: { method: 'POST', path: '/api/sites/y' },
      res: { statusCode: 500 },
      err: { type: 'Error', message: 'failed with status code 500' },
      msg: 'request errored',
    });
    expect(Object.keys(lines[1])).toEqual(['level', 'time', 'service', 'req', 'res', 'err', 'responseTime', 'msg']);
  });

  it('makes no child logger for a line below the level, and one for a handler that logs', async () => {
    const { lines, logger, url } = await serve('info', (req, res) => {
      if (req.url === '/api/fails') req.log?.warn({ dependency: 'database' }, 'dependency unavailable');
      reply(200)(req, res);
    });
    const child = vi.spyOn(logger, 'child');
    await (await fetch(`${url}/api/health/live`)).arrayBuffer();
    await (await fetch(`${url}/api/fails`)).arrayBuffer();
    await vi.waitFor(() => expect(lines).toHaveLength(1));
    expect(child).toHaveBeenCalledTimes(1);
    expect(fields({ responseTime: 0, ...lines[0] })).toMatchObject({
      level: 40,
      req: { method: 'GET', path: '/api/fails' },
      dependency: 'database',
      msg: 'dependency unavailable',
    });
  });
});

// A recording HTTP proxy in front of the S3 fake, for tests that need to see or break what the
// API's SDK sends: every request is forwarded as is, its method and URL recorded, and its status
// once the fake has answered; `failGets` makes matching GETs fail as a storage blip does (the
// connection reset without an answer).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { testEnv } from './test-app.js';

export interface S3Proxy {
  endpoint: string;
  /**
   * `status` is set when the fake's answer arrives: a request seen but not yet answered may not
   * have taken effect (an abort seen here can still leave its upload listed).
   */
  requests: { method: string; url: string; status?: number }[];
  /** GETs whose path this returns true for are reset instead of forwarded. */
  failGets: (path: string) => boolean;
  close: () => Promise<void>;
}

export async function startS3Proxy(): Promise<S3Proxy> {
  const target = new URL(testEnv().S3_ENDPOINT);
  const proxy: S3Proxy = { endpoint: '', requests: [], failGets: () => false, close: async () => undefined };
  const server = http.createServer((req, res) => {
    const url = req.url ?? '/';
    const record: S3Proxy['requests'][number] = { method: req.method ?? '', url };
    proxy.requests.push(record);
    if (req.method === 'GET' && proxy.failGets(url.split('?')[0])) {
      req.socket.destroy();
      return;
    }
    const upstream = http.request(
      { host: target.hostname, port: target.port, method: req.method, path: url, headers: req.headers },
      (answer) => {
        record.status = answer.statusCode;
        res.writeHead(answer.statusCode ?? 502, answer.headers);
        answer.pipe(res);
      },
    );
    upstream.on('error', () => res.destroy());
    req.pipe(upstream);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  proxy.endpoint = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  proxy.close = () =>
    new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    });
  return proxy;
}

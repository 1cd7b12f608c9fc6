import { Me } from '@torquetrail/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiRequest } from './api-client';

const reply = (status: number, body?: unknown) =>
  new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });

const me = {
  id: '00000000-0000-4000-8000-000000000001',
  email: 'dana@example.test',
  displayName: 'Dana Varga',
  role: 'dentist',
  practiceId: '00000000-0000-4000-8000-000000000900',
  practiceName: 'Riverside Dental',
  dateFormat: 'day-month-year',
  sharedPatientIds: [],
  shares: [],
  session: { idleSignOutS: 900, warnBeforeS: 60, reauthenticateAt: '2026-01-01T20:00:00.000Z' },
};

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('apiRequest', () => {
  it('sends JSON with the session cookie and parses the reply with its contract', async () => {
    const fetch = vi.fn().mockResolvedValue(reply(200, me));
    vi.stubGlobal('fetch', fetch);
    await expect(apiRequest('/api/auth/sign-in', { method: 'POST', body: { a: 1 }, schema: Me })).resolves.toEqual(me);
    const [, init] = fetch.mock.calls[0];
    expect(init).toMatchObject({ method: 'POST', credentials: 'same-origin', body: '{"a":1}' });
    expect(init.headers['Content-Type']).toBe('application/json');
  });

  it('throws an ApiError with the reply message and fields', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn().mockResolvedValue(
        reply(400, {
          statusCode: 400,
          error: 'Bad Request',
          message: 'Invalid',
          fields: { email: 'Enter a valid e-mail address' },
        }),
      ),
    );
    const error = await apiRequest('/api/x').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, message: 'Invalid', fields: { email: 'Enter a valid e-mail address' } });
  });

  it('copes with a non-JSON error body, a 204, an unreachable server and a contract mismatch', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn().mockResolvedValue(new Response('<html>', { status: 502, statusText: 'Bad Gateway' })),
    );
    await expect(apiRequest('/api/x')).rejects.toMatchObject({ status: 502 });

    vi.stubGlobal('fetch', vi.fn().mockResolvedValue(new Response(null, { status: 204 })));
    await expect(apiRequest('/api/auth/sign-out', { method: 'POST' })).resolves.toBeUndefined();

    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')));
    await expect(apiRequest('/api/x')).rejects.toMatchObject({ status: 0 });

    vi.spyOn(console, 'error').mockImplementation(() => {});
    vi.stubGlobal('fetch', vi.fn().mockResolvedValue(reply(200, { id: 'nope' })));
    await expect(apiRequest('/api/auth/me', { schema: Me })).rejects.toMatchObject({ status: 0 });
  });
});

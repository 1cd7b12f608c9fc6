import { z } from 'zod';
import { apiRoutes, ErrorReply } from '@torquetrail/contracts';

const jsonSchema = (schema: z.ZodType) =>
  z.toJSONSchema(schema, { target: 'openapi-3.0', unrepresentable: 'any', io: 'output' });

/** OpenAPI 3 document generated from the contracts' route list, so the docs cannot drift from the pipes. */
export function buildOpenApiDocument() {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const route of apiRoutes) {
    const openApiPath = '/api' + route.path.replace(/:(\w+)/g, '{$1}');
    const params = [...route.path.matchAll(/:(\w+)/g)].map((m) => ({
      name: m[1],
      in: 'path',
      required: true,
      schema: { type: 'string', format: 'uuid' },
    }));
    const queryParams = route.query
      ? Object.entries((jsonSchema(route.query) as { properties?: Record<string, unknown> }).properties ?? {}).map(
          ([name, schema]) => ({ name, in: 'query', required: false, schema }),
        )
      : [];
    const error = { description: 'Error', content: { 'application/json': { schema: jsonSchema(ErrorReply) } } };
    const success = route.status ?? (route.method === 'post' ? 201 : 200);
    paths[openApiPath] ??= {};
    paths[openApiPath][route.method] = {
      summary: route.summary,
      security: route.signedIn ? [{ sessionCookie: [] }] : [],
      parameters: [...params, ...queryParams],
      ...(route.body
        ? { requestBody: { required: true, content: { 'application/json': { schema: jsonSchema(route.body) } } } }
        : {}),
      responses: {
        ...(route.noContent
          ? { 204: { description: 'Done' } }
          : route.produces
            ? {
                [success]: {
                  description: 'OK',
                  content: { [route.produces]: { schema: { type: 'string', format: 'binary' } } },
                },
              }
            : {
                [success]: {
                  description: 'OK',
                  content: route.reply ? { 'application/json': { schema: jsonSchema(route.reply) } } : {},
                },
              }),
        ...(route.body || route.query ? { 400: error } : {}),
        ...(route.signedIn ? { 401: error, 403: error, 404: error } : {}),
      },
    };
  }
  return {
    openapi: '3.0.3',
    info: {
      title: 'Torquetrail API',
      version: '0.1.0',
      description:
        'The per-implant restoration ledger. Every route except sign-in, sign-out and health needs the session cookie.',
    },
    components: { securitySchemes: { sessionCookie: { type: 'apiKey', in: 'cookie', name: 'tt_session' } } },
    paths,
  };
}

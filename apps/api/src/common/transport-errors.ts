import type { HttpException } from '@nestjs/common';

/** Plain words for refusals raised by Express and body-parser before a route runs, by status. */
const BY_STATUS: Record<number, string> = {
  400: 'The request could not be read',
  413: 'The request is larger than this product accepts',
  415: 'This kind of content is not accepted here',
};

/**
 * The message for an exception the HTTP layer raised (Nest maps body-parser and Express errors to
 * HttpExceptions that carry the library's own wording, e.g. "Unexpected token 'N' … is not valid
 * JSON"); undefined for the API's own exceptions, whose messages are already written for users.
 */
export function transportMessage(exception: HttpException): string | undefined {
  const cause = exception.cause;
  if (cause instanceof SyntaxError) return 'The request body is not valid JSON';
  if (cause instanceof URIError) return 'The address of the request is not valid';
  const status = (cause as { statusCode?: unknown } | undefined)?.statusCode;
  if (typeof status === 'number') return BY_STATUS[status] ?? 'The request could not be read';
  return undefined;
}

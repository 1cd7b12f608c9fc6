import { BadRequestException } from '@nestjs/common';

/**
 * A 400 naming the fields at fault (path → message), in the same shape the zod pipe gives, so the
 * web shows it beside the inputs. The message defaults to every "path: problem" joined.
 */
export const fieldError = (fields: Record<string, string>, message?: string) =>
  new BadRequestException({
    message:
      message ??
      Object.entries(fields)
        .map(([k, v]) => `${k}: ${v}`)
        .join('; '),
    fields,
  });

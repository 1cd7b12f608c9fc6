import { BadRequestException, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';
import { entriesToCorrect } from './field-error.js';

/** Field path → message, for the web to show beside each field. */
function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length > 0 ? issue.path.join('.') : '(body)';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Validates a body, query or param with a contracts schema; 400 naming the fields otherwise. */
export class ZodValidationPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.infer<S> {
    const result = this.schema.safeParse(value);
    if (result.success) return result.data;
    const fields = fieldErrors(result.error);
    throw new BadRequestException({ message: entriesToCorrect(Object.keys(fields).length), fields });
  }
}

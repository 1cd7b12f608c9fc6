import { BadRequestException } from '@nestjs/common';

/**
 * The summary of a 400 with field problems, in plain words: the machine paths stay in `fields`
 * (for clients, which put each message beside its field), never in a sentence a user reads.
 */
export function entriesToCorrect(count: number): string {
  if (count === 0) return 'The request is not valid';
  return count === 1 ? 'One entry needs correcting' : `${count} entries need correcting`;
}

/**
 * A 400 naming the fields at fault (path → message), in the same shape the zod pipe gives, so the
 * web shows it beside the inputs.
 */
export const fieldError = (fields: Record<string, string>, message?: string) =>
  new BadRequestException({ message: message ?? entriesToCorrect(Object.keys(fields).length), fields });

import { z } from 'zod';

/** Every id in the API is a UUID. */
export const Id = z.uuid();

/** A calendar date as YYYY-MM-DD (no time zone). */
export const IsoDate = z.iso.date();

/** An instant as an ISO 8601 string with offset. */
export const IsoDateTime = z.iso.datetime({ offset: true });

/** FDI (ISO 3950) two-digit tooth position, permanent or primary. */
export const FdiPosition = z.number().int().min(11).max(85);

/** The error body every failing route answers with. */
export const ErrorReply = z.object({
  statusCode: z.number().int(),
  error: z.string(),
  message: z.string(),
  /** Field-level problems for 400 replies: path (dot-joined) → message. */
  fields: z.record(z.string(), z.string()).optional(),
  /** The request's id, also in the X-Request-Id header and in every log line of the request. */
  requestId: z.string().optional(),
});
export type ErrorReply = z.infer<typeof ErrorReply>;

/** A component of an implant axis (direction vector): any scale gives the same angle, so a sane bound keeps out overflow. */
export const AxisComponent = z
  .number()
  .min(-1000, { error: 'Axis components lie between −1000 and 1000' })
  .max(1000, { error: 'Axis components lie between −1000 and 1000' });

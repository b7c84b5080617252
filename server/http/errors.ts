import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError, type ZodType, type z } from 'zod';
import type { ErrorCode } from '../../src/contracts/errors';

/** An error that carries its HTTP status and the API's error body. Services throw these. */
export class HttpError extends Error {
  constructor(
    public status: number,
    public code: ErrorCode,
    message: string,
    public fields?: Record<string, string>,
    public extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) => new HttpError(400, 'validation', message, fields);
export const notFound = (what = 'Not found') => new HttpError(404, 'not_found', what);
export const forbidden = (message = 'Your role may not do this') => new HttpError(403, 'forbidden', message);
export const ruleBroken = (message: string, fields?: Record<string, string>) => new HttpError(422, 'rule', message, fields);
export const conflict = (message: string, extra?: Record<string, unknown>) => new HttpError(409, 'conflict', message, undefined, extra);

/** Maps each bad field's path (dot-separated) to a readable message. */
export function zodFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Validates input against a contract schema; a failure becomes 400 `validation` with `fields`. */
export function parse<S extends ZodType>(schema: S, input: unknown): z.output<S> {
  const r = schema.safeParse(input);
  if (!r.success) {
    const fields = zodFields(r.error);
    const n = Object.keys(fields).length;
    throw badRequest(n === 1 ? `${Object.keys(fields)[0]}: ${Object.values(fields)[0]}` : `${n} fields need attention`, fields);
  }
  return r.data;
}

/** Parses a positive integer route parameter; anything else is a 404 (no such record). */
export function idParam(value: unknown): number {
  const n = typeof value === 'string' && /^\d{1,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(n) || n <= 0) throw notFound();
  return n;
}

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl}` } });
};

/** The last middleware: one JSON shape for every error, no stack traces to the client. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields && { fields: err.fields }), ...err.extra } });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({ error: { code: 'validation', message: 'Some fields need attention', fields: zodFields(err) } });
    return;
  }
  const e = err as { type?: string; status?: number; code?: string; field?: string };
  if (e?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'bad_json', message: 'The request body is not valid JSON' } });
    return;
  }
  if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: { code: 'payload_too_large', message: 'The request is too large', ...(e.field && { fields: { [e.field]: 'File too large' } }) } });
    return;
  }
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
    res.status(e.status).json({ error: { code: 'validation', message: (err as Error).message } });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged' } });
};

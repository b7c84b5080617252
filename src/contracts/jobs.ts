import { z } from 'zod';

export const JOB_STATES = ['waiting', 'active', 'completed', 'failed'] as const;
export type JobStateName = (typeof JOB_STATES)[number];

/** GET /api/jobs/:id */
export const jobStateResponse = z.object({
  id: z.string(),
  state: z.enum(JOB_STATES),
  progress: z.number().min(0).max(100),
  result: z.unknown().optional(),
  error: z.string().optional(),
});
export type JobStateResponse = z.infer<typeof jobStateResponse>;

export const failedJob = z.object({
  id: z.string(),
  queue: z.string(),
  name: z.string(),
  error: z.string(),
  attempts: z.number().int(),
  failedAt: z.string().nullable(),
  data: z.unknown(),
});
export type FailedJob = z.infer<typeof failedJob>;

export const NOTIFICATION_STATUSES = ['pending', 'sending', 'sent', 'failed', 'skipped'] as const;
export const notificationRecord = z.object({
  id: z.number().int(),
  kind: z.string(),
  status: z.enum(NOTIFICATION_STATUSES),
  recipients: z.array(z.object({ name: z.string(), email: z.string() })),
  orderId: z.number().int().nullable(),
  orderNumber: z.string().nullable(),
  reason: z.string().nullable(),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  messageId: z.string().nullable(),
});
export type NotificationRecord = z.infer<typeof notificationRecord>;

export const outboxResponse = z.object({
  notifications: z.array(notificationRecord),
  /** The local mailbox viewer, in local runs only. */
  mailViewerUrl: z.string().nullable(),
});
export type OutboxResponse = z.infer<typeof outboxResponse>;

export const listOutboxQuery = z.object({ status: z.enum(NOTIFICATION_STATUSES).optional() });

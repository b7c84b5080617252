import { Router } from 'express';
import { listOutboxQuery, type NotificationRecord } from '../../src/contracts/jobs';
import type { Deps } from '../deps';
import { allow } from '../http/access';
import { idParam, parse } from '../http/errors';
import * as outbox from './service';

function toRecord(n: outbox.NotificationRow): NotificationRecord {
  const payload = n.payload as { orderNumber?: unknown };
  return {
    id: n.id,
    kind: n.kind,
    status: n.status,
    recipients: n.recipients,
    orderId: n.orderId,
    orderNumber: typeof payload.orderNumber === 'string' ? payload.orderNumber : null,
    reason: n.reason,
    attempts: n.attempts,
    lastError: n.lastError,
    createdAt: n.createdAt.toISOString(),
    sentAt: n.sentAt?.toISOString() ?? null,
    messageId: n.messageId,
  };
}

export function notificationsRouter(deps: Deps) {
  const r = Router();
  r.get('/notifications', allow('admin'), async (req, res) => {
    const { status } = parse(listOutboxQuery, req.query);
    const rows = await outbox.listNotifications(deps.db, status);
    res.json({ notifications: rows.map(toRecord), mailViewerUrl: deps.config.mailViewerUrl ?? null });
  });
  r.post('/notifications/:id/retry', allow('admin'), async (req, res) => {
    res.json({ notification: toRecord(await outbox.retryNotification(deps.db, idParam(req.params.id))) });
  });
  return r;
}

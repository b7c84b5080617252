import type { Job } from 'bullmq';
import type { Deps } from '../../server/deps';
import { recordFailure, sendNotification } from '../../server/notifications/service';
import { getShopSettings } from '../../server/settings/service';
import { mailAttachments } from '../mail/attachments';
import { renderMail } from '../mail/templates';

export type MailJobData = { notificationId: number };

/** Test-only pause between rendering and sending, so a test can kill a worker mid-send. */
const testDelay = () => (process.env.NODE_ENV === 'test' ? Number(process.env.SPOOLWRIGHT_TEST_MAIL_DELAY_MS ?? 0) : 0);

/** Sends one outbox row by e-mail (see server/notifications/service.ts for the exactly-once rule). */
export function mailProcessor(deps: Deps) {
  return async (job: Job<MailJobData>) => {
    const id = job.data.notificationId;
    try {
      const outcome = await sendNotification(deps.db, id, async (row) => {
        const shop = await getShopSettings(deps.db);
        const mail = renderMail(row.kind, row.payload, { shopName: shop.name, publicUrl: deps.config.publicUrl });
        const files = [...(mail.attachments ?? []), ...(await mailAttachments(deps, row))];
        const delay = testDelay();
        if (delay > 0) await new Promise((r) => setTimeout(r, delay));
        const domain = new URL(deps.config.publicUrl).hostname || 'spoolwright.local';
        const info = await deps.mailer.transport.sendMail({
          from: deps.mailer.from,
          ...(shop.replyTo && { replyTo: shop.replyTo }),
          to: row.recipients.map((r) => ({ name: r.name, address: r.email })),
          subject: mail.subject,
          text: mail.text,
          html: mail.html,
          messageId: `<notification-${id}@${domain}>`,
          headers: { 'X-Spoolwright-Notification': String(id) },
          attachments: files,
        });
        return { messageId: info.messageId };
      });
      if (outcome.outcome === 'busy') throw new Error('Another worker is sending this message right now');
      return outcome;
    } catch (e) {
      const final = job.attemptsMade + 1 >= (job.opts.attempts ?? 1);
      await recordFailure(deps.db, id, e instanceof Error ? e.message : String(e), final).catch(() => {});
      throw e;
    }
  };
}

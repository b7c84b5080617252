import nodemailer from 'nodemailer';

/** Outgoing mail over SMTP: the local catcher in development, any relay in production. */
export function createMailer(smtpUrl: string, from: string) {
  const transport = nodemailer.createTransport(smtpUrl, { from });
  return {
    transport,
    from,
    async check() {
      await Promise.race([
        transport.verify(),
        new Promise((_, reject) => setTimeout(() => reject(new Error('SMTP did not answer within 3 s')), 3_000)),
      ]);
    },
    close() {
      transport.close();
    },
  };
}
export type Mailer = ReturnType<typeof createMailer>;

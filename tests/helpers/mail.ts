import { LOCAL } from '../../server/config';

/** A message as the mail catcher's REST API lists it. */
export type CaughtMail = {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string; name: string }[];
  headers: Record<string, string>;
  attachments?: { fileName: string; generatedFileName: string; contentType: string; length: number }[];
};

const viewer = `http://${LOCAL.mailViewer.host}:${LOCAL.mailViewer.port}`;

export async function caughtMail(): Promise<CaughtMail[]> {
  const res = await fetch(`${viewer}/email`);
  if (!res.ok) throw new Error(`mail catcher answered ${res.status}`);
  return (await res.json()) as CaughtMail[];
}

/**
 * Messages about one outbox row: stamped with its notification id and naming a token unique to
 * this test (ids restart with every reset of the test database; the catcher keeps old mail).
 */
export async function mailForNotification(id: number, token: string) {
  return (await caughtMail()).filter(
    (m) => String(m.headers['x-spoolwright-notification']) === String(id) && (m.subject.includes(token) || m.text.includes(token)),
  );
}

/** Waits until `predicate` holds for the caught messages, or fails after `ms`. */
export async function waitForMail(predicate: (all: CaughtMail[]) => boolean, ms = 30_000) {
  const until = Date.now() + ms;
  for (;;) {
    const all = await caughtMail();
    if (predicate(all)) return all;
    if (Date.now() > until) throw new Error(`mail did not arrive within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Polls an async condition until it holds, or fails after `ms`. */
export async function waitUntil(check: () => Promise<boolean>, ms = 30_000, what = 'the condition') {
  const until = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`${what} did not hold within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

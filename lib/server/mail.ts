import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { getEnv } from '@/lib/env';
import { escapeHtml } from '@/lib/html';

const store = globalThis as unknown as { vinewardMailer?: Transporter };

/**
 * Given a URL, nodemailer reads its options from the URL alone (other options beside `url` are
 * dropped), so the deadlines go into its query string, which nodemailer reads as options.
 */
function withTimeouts(url: string, timeouts: Record<string, number>) {
  const u = new URL(url);
  for (const [name, ms] of Object.entries(timeouts)) if (!u.searchParams.has(name)) u.searchParams.set(name, String(ms));
  return u.toString();
}

function transport() {
  if (!store.vinewardMailer) {
    const env = getEnv();
    // nodemailer waits 2 minutes to connect, 30 s for the greeting and 10 minutes on a silent
    // socket by default; a stalled mail server would hold the outbox worker (and an e-mail-link
    // sign-in) for that long.
    store.vinewardMailer = nodemailer.createTransport(
      withTimeouts(env.SMTP_URL, {
        connectionTimeout: env.SMTP_CONNECTION_TIMEOUT_MS,
        greetingTimeout: env.SMTP_GREETING_TIMEOUT_MS,
        socketTimeout: env.SMTP_SOCKET_TIMEOUT_MS,
      }),
    );
  }
  return store.vinewardMailer;
}

/** For /api/health: whether the mail server greets us within a few seconds. */
export async function mailReachable(timeoutMs = 3000): Promise<boolean> {
  const probe = nodemailer.createTransport(
    withTimeouts(getEnv().SMTP_URL, { connectionTimeout: timeoutMs, greetingTimeout: timeoutMs, socketTimeout: timeoutMs }),
  );
  try {
    return await probe.verify();
  } catch {
    return false;
  } finally {
    probe.close();
  }
}

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Notification mail sets one derived from its outbox row, so a receiver can drop a repeat. */
  messageId?: string;
  headers?: Record<string, string>;
}

export async function sendMail(mail: Mail) {
  await transport().sendMail({ from: getEnv().MAIL_FROM, ...mail });
}

/**
 * A plain, readable mail: our wordmark, a paragraph (its line breaks kept), one big link, and an
 * optional footer. Filled by concatenation only: what people wrote (comments, names, notes) may
 * hold `$'` or `$&`, which a string passed to String.replace would expand.
 */
export function linkMail(o: {
  to: string;
  subject: string;
  intro: string;
  action: string;
  url: string;
  outro?: string;
  footer?: { text: string; html: string };
}): Mail {
  const text = [o.intro, `${o.action}: ${o.url}`, o.outro, '— Vineward', o.footer?.text].filter(Boolean).join('\n\n');
  const html = `<div style="font-family:sans-serif;max-width:32rem">
<p style="font-size:20px;font-weight:700;color:#2f4a1f">Vineward</p>
<p>${escapeHtml(o.intro).split('\n').join('<br>')}</p>
<p><a href="${escapeHtml(o.url)}" style="display:inline-block;padding:12px 20px;background:#2f4a1f;color:#fff;border-radius:8px;text-decoration:none">${escapeHtml(o.action)}</a></p>
<p style="color:#555">${escapeHtml(o.outro ?? '')}</p>${o.footer?.html ?? ''}</div>`;
  return { to: o.to, subject: o.subject, text, html };
}

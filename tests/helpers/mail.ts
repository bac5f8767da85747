/** Reads what the app sent, from the SMTP fake's inbox API. */
export interface FakeMail {
  id: number;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

const inbox = () => {
  const url = process.env.SMTP_INBOX_URL;
  if (!url) throw new Error('SMTP_INBOX_URL is not set: run the tests through `npm test`');
  return url;
};

export async function mailsTo(address: string): Promise<FakeMail[]> {
  const res = await fetch(`${inbox()}/api/messages?to=${encodeURIComponent(address)}`);
  return (await res.json()) as FakeMail[];
}

/** Waits for the n-th mail to an address (mail may be sent after the response). */
export async function waitForMail(address: string, count = 1, timeoutMs = 10_000): Promise<FakeMail[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mails = await mailsTo(address);
    if (mails.length >= count) return mails;
    if (Date.now() > deadline) throw new Error(`Expected ${count} mail(s) to ${address}, got ${mails.length}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export function firstLink(mail: FakeMail, pathPart: string) {
  const match = mail.text.match(new RegExp(`https?://\\S*${pathPart}\\S*`));
  if (!match) throw new Error(`No link containing ${pathPart} in: ${mail.text}`);
  return match[0];
}

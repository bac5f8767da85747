import nodemailer from 'nodemailer';
import { describe, expect, it } from 'vitest';

// The local inbox is what a person trying the demo reads sign-in links and notifications in.
const inbox = () => process.env.SMTP_INBOX_URL!;

describe('the local inbox', () => {
  it('shows the HTML part of a mail in a frame that runs no script, beside its text part', async () => {
    const subject = `Inbox check ${Date.now()}`;
    await nodemailer.createTransport(process.env.SMTP_URL!).sendMail({
      from: 'Vineward <no-reply@example.com>',
      to: 'inbox-check@example.com',
      subject,
      text: 'Open the block: http://localhost/blocks/1',
      html: '<p>Open <a href="http://localhost/blocks/1">the block</a></p><script>parent.document.title="owned"</script>',
    });
    const page = await (await fetch(inbox())).text();
    const article = page.slice(page.indexOf(subject));
    const frame = article.match(/<iframe[^>]*>/)?.[0] ?? '';
    expect(frame).toContain('sandbox="allow-popups allow-popups-to-escape-sandbox"');
    expect(frame).not.toContain('allow-scripts');
    expect(frame).not.toContain('allow-same-origin');
    // The mail's markup is only inside srcdoc, escaped: nothing of it runs in the inbox page itself.
    expect(frame).toContain('srcdoc="&lt;base target=&quot;_blank&quot;&gt;&lt;p&gt;Open &lt;a href=&quot;http://localhost/blocks/1&quot;');
    expect(article).not.toContain('<script>');
    expect(article).toContain('<a href="http://localhost/blocks/1">http://localhost/blocks/1</a>');
  });
});

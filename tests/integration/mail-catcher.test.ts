import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailCatcher, type MailCatcher } from '@/lib/fakes/mail/catcher';
import { signInLinkMail } from '@/lib/mail/templates';
import { freePort } from '../../scripts/lib/postgres';

let catcher: MailCatcher;
beforeAll(async () => {
  catcher = await startMailCatcher({ smtpPort: await freePort(), apiPort: await freePort() });
});
afterAll(() => catcher.close());

describe('the local SMTP catcher', () => {
  it('receives what nodemailer sends over plain SMTP and lists it over HTTP', async () => {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.smtpPort, secure: false, ignoreTLS: true });
    await transport.sendMail({ from: 'Lacewright <no-reply@lacewright.test>', ...signInLinkMail('Someone@Example.test', 'http://127.0.0.1/link?token=abc') });
    const res = await fetch(`http://127.0.0.1:${catcher.apiPort}/messages?to=someone@example.test`);
    const messages = (await res.json()) as { subject: string; text: string; html: string }[];
    expect(messages).toHaveLength(1);
    expect(messages[0].subject).toBe('Your Lacewright sign-in link');
    expect(messages[0].text).toContain('http://127.0.0.1/link?token=abc');
    expect(messages[0].html).toContain('href="http://127.0.0.1/link?token=abc"');
  });
});

import 'server-only';
import nodemailer from 'nodemailer';
import { env } from '@/lib/env';

// Plain SMTP to whatever host the environment names: the local catcher here, a provider in production.
export const mailTransport = nodemailer.createTransport({
  host: env.SMTP_HOST,
  port: env.SMTP_PORT,
  secure: false,
  ignoreTLS: env.SMTP_HOST === '127.0.0.1' || env.SMTP_HOST === 'localhost',
  connectionTimeout: 5_000,
});

export interface MailContent {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export async function sendMail(message: MailContent): Promise<void> {
  await mailTransport.sendMail({ from: env.MAIL_FROM, ...message });
}

import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface OutgoingMessage {
  to: string[];
  subject: string;
  text: string;
}

export interface Mailer {
  send(message: OutgoingMessage): Promise<void>;
  close(): void;
}

/** SMTP through nodemailer; locally that is the mail catcher on 127.0.0.1. */
export function createSmtpMailer(config: Config): Mailer {
  const transport = nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: false,
    ignoreTLS: config.SMTP_HOST === '127.0.0.1' || config.SMTP_HOST === 'localhost',
    connectionTimeout: 5000,
  });
  return {
    async send(message) {
      await transport.sendMail({
        from: config.MAIL_FROM,
        to: message.to,
        subject: message.subject,
        text: message.text,
      });
    },
    close: () => transport.close(),
  };
}

import nodemailer from 'nodemailer';

export type Mail = { to: string; subject: string; text: string; html?: string };
export type Mailer = { send(mail: Mail): Promise<void> };

/** Sends through SMTP; on this machine the SMTP server is the local mail fake. */
export function createSmtpMailer(options: { host: string; port: number; from: string }): Mailer {
  const transport = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    ignoreTLS: true,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail });
    },
  };
}

import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  date: string;
}

export interface FakeSmtp {
  url: string;
  messages: CapturedMail[];
  close(): Promise<void>;
}

const KEEP_MESSAGES = 500;

/** A local SMTP server on loopback that keeps what it receives, so the demo can show its mail. */
export async function startFakeSmtp(): Promise<FakeSmtp> {
  const messages: CapturedMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = Array.isArray(mail.to) ? mail.to.map((address) => address.text).join(', ') : (mail.to?.text ?? '');
          messages.unshift({
            to,
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            date: (mail.date ?? new Date()).toISOString(),
          });
          messages.splice(KEEP_MESSAGES);
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    url: `smtp://127.0.0.1:${port}`,
    messages,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}

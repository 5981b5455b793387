import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedAttachment {
  fileName: string;
  contentType: string;
  sizeBytes: number;
}

export interface CapturedMail {
  /** Counts up from 1 in the order mail arrives; stable while the server runs. */
  id: number;
  to: string;
  subject: string;
  text: string;
  html: string;
  date: string;
  attachments: CapturedAttachment[];
}

export interface FakeSmtp {
  url: string;
  messages: CapturedMail[];
  /** The bytes of one attachment of a kept message, or null when either is not there. */
  attachment(mailId: number, index: number): (CapturedAttachment & { content: Buffer }) | null;
  close(): Promise<void>;
}

const KEEP_MESSAGES = 500;

/** A local SMTP server on loopback that keeps what it receives, so the demo can show its mail. */
export async function startFakeSmtp(): Promise<FakeSmtp> {
  const messages: CapturedMail[] = [];
  const contents = new Map<number, Buffer[]>();
  let lastId = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = Array.isArray(mail.to) ? mail.to.map((address) => address.text).join(', ') : (mail.to?.text ?? '');
          lastId += 1;
          const files = mail.attachments.filter((attachment) => attachment.contentDisposition !== 'inline');
          messages.unshift({
            id: lastId,
            to,
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            date: (mail.date ?? new Date()).toISOString(),
            attachments: files.map((file, index) => ({
              fileName: file.filename ?? `attachment-${index + 1}`,
              contentType: file.contentType,
              sizeBytes: file.content.length,
            })),
          });
          contents.set(
            lastId,
            files.map((file) => file.content),
          );
          for (const dropped of messages.splice(KEEP_MESSAGES)) contents.delete(dropped.id);
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
    attachment(mailId, index) {
      const mail = messages.find((message) => message.id === mailId);
      const content = contents.get(mailId)?.[index];
      const meta = mail?.attachments[index];
      return meta && content ? { ...meta, content } : null;
    },
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}

// A local SMTP fake for development and tests: accepts every message on 127.0.0.1 and keeps it as an
// .eml file in DENUDATA_MAIL_DIR (default .denudata/mail). Never relays anything.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

const port = Number(process.env.DENUDATA_SMTP_PORT ?? 2525);
const folder = path.resolve(process.env.DENUDATA_MAIL_DIR ?? '.denudata/mail');
mkdirSync(folder, { recursive: true });
let counter = 0;

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  size: 5 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on('data', (chunk: Buffer) => chunks.push(chunk));
    stream.on('end', () => {
      const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${process.pid}-${++counter}.eml`;
      const envelope = `X-Denudata-Envelope-To: ${session.envelope.rcptTo.map((r) => r.address).join(', ')}\r\n`;
      writeFileSync(path.join(folder, name), envelope + Buffer.concat(chunks).toString('utf8'));
      callback();
    });
  },
});

server.on('error', (error) => {
  console.error(`mail fake: ${error.message}`);
  process.exit(1);
});
server.listen(port, '127.0.0.1', () => console.log(`mail fake: listening on 127.0.0.1:${port}, keeping messages in ${folder}`));
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.close(() => process.exit(0)));

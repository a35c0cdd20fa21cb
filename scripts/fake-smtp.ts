/** `tsx scripts/fake-smtp.ts`: the local fake SMTP server for development and tests. */
import { config } from '../src/lib/server/config';
import { fakeSmtpServer } from '../src/lib/server/dev-mailbox';

const c = config();
const dir = c.DEV_MAILBOX_DIR ?? '.data/mailbox';
const server = fakeSmtpServer(dir);
server.listen(c.SMTP_PORT, '127.0.0.1', () => console.log(`[fake-smtp] listening on 127.0.0.1:${c.SMTP_PORT}, storing in ${dir}`));
server.on('error', (err) => {
	console.error(`[fake-smtp] ${err.message}`);
	process.exit(1);
});
const stop = () => server.close(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

/** The local fake SMTP server as its own process: `tsx jobs/mailbox.ts` (development). */
import { config } from '../src/lib/server/config';
import { sequelize } from '../src/lib/server/db/sequelize';
import { startMailbox } from '../src/lib/server/mailbox';

const server = await startMailbox(config.SMTP_PORT, config.SMTP_HOST);
console.log(`mailbox: fake SMTP on ${config.SMTP_HOST}:${config.SMTP_PORT}, messages kept in ${config.DB_NAME}.mail_messages`);
const stop = () => server.close(() => void sequelize.close().finally(() => process.exit(0)));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

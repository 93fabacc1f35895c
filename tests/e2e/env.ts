/** Where the browser suite's server lives and which database it uses (see vite.config.ts). */
export const E2E_PORT = Number(process.env.E2E_PORT ?? 3100);
export const BASE_URL = `http://127.0.0.1:${E2E_PORT}`;
export const E2E_ENV = {
  LOFTWISE_ENV: 'test',
  DB_NAME: 'loftwise_e2e',
  QUEUE_PREFIX: 'lw-e2e',
  SMTP_PORT: '2527',
  ORIGIN: BASE_URL
};

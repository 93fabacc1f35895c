/**
 * Integration suite set-up: MariaDB and Redis on loopback (idempotent start), then the test
 * database reset to an empty schema, migrated and seeded with the demo scenario.
 */
import { execFileSync } from 'node:child_process';
import { dbCli, ROOT } from '../helpers/processes';

export const TEST_ENV = { LOFTWISE_ENV: 'test' };

export default function setup() {
  execFileSync('bash', ['docker/services.sh', 'start'], { cwd: ROOT, stdio: 'inherit' });
  dbCli('reset', TEST_ENV);
  dbCli('seed', TEST_ENV);
}

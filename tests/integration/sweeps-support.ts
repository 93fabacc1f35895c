/**
 * Shared by the sweep integration tests: demo users as App.Locals, a study per test, specs of
 * a chosen size (the invented examples of src/lib/sweep/examples.ts), polling, and workers as
 * child processes (`tsx jobs/worker.ts`, LOFTWISE_ENV=test) with a short sweep lock so a
 * killed worker's chunk is picked up within seconds.
 */
import './sweeps-env';
import { randomUUID } from 'node:crypto';
import { Study, Sweep, User, Workspace } from '../../src/lib/server/db/models';
import { EXAMPLE_SIZING_INPUT } from '../../src/lib/sweep/examples';
import type { SweepSpecInput } from '../../src/lib/sweep/spec';
import { startWorker, type Running } from '../helpers/processes';

export const WORKER_ENV = { LOFTWISE_ENV: 'test', SWEEP_LOCK_MS: '2000', LOG_LEVEL: 'warn' };

export async function localsFor(email: string, via: 'cookie' | 'token' = 'cookie'): Promise<App.Locals> {
  const u = await User.findOne({ where: { email } });
  if (!u) throw new Error(`no demo user ${email}`);
  return {
    user: { id: u.id, email: u.email, displayName: u.displayName, units: u.units },
    session: null,
    via,
    requestId: randomUUID()
  } as App.Locals;
}

export async function newStudy(slug: string, name = `study ${randomUUID().slice(0, 8)}`) {
  const ws = await Workspace.findOne({ where: { slug } });
  if (!ws) throw new Error(`no workspace ${slug}`);
  return Study.create({ workspaceId: ws.id, name, question: 'integration test', createdBy: null });
}

/**
 * The example sizing sweep (5 structural coefficients × 3 upper-stage propulsions × k lift-off
 * T/W levels) grown to about `cases` cases: 15·k with k = ceil(cases / 15).
 */
export function sizingSpec(cases: number, name = 'integration sweep'): SweepSpecInput & { name: string } {
  const spec = structuredClone(EXAMPLE_SIZING_INPUT) as SweepSpecInput & { name: string };
  spec.name = name;
  const tw = spec.sweep.parameters![2];
  tw.values = { kind: 'count', min: 1.2, max: 1.6, count: Math.max(2, Math.ceil(cases / 15)) };
  return spec;
}

export async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, timeoutMs = 30_000, everyMs = 100): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

export async function sweepRow(id: number) {
  const s = await Sweep.findByPk(id);
  if (!s) throw new Error(`sweep ${id} vanished`);
  return s;
}

export function waitForStatus(id: number, status: string | string[], timeoutMs = 30_000) {
  const want = Array.isArray(status) ? status : [status];
  return waitFor(`sweep ${id} to be ${want.join('|')}`, async () => {
    const s = await sweepRow(id);
    if (s.status === 'failed' && !want.includes('failed')) throw new Error(`sweep ${id} failed: ${s.error}`);
    return want.includes(s.status) ? s : null;
  }, timeoutMs);
}

export function workers(n: number, prefix: string): Running[] {
  return Array.from({ length: n }, (_, i) => startWorker(`${prefix}-${i}`, WORKER_ENV));
}

/**
 * SIGKILL a started worker and its descendants, by pid: `tsx` runs the script in a child
 * node process, and a SIGKILL cannot be relayed to it.
 */
export async function killHard(w: Running) {
  const { readdirSync, readFileSync } = await import('node:fs');
  const root = w.child.pid!;
  const parents = new Map<number, number>();
  for (const d of readdirSync('/proc')) {
    if (!/^\d+$/.test(d)) continue;
    try {
      const stat = readFileSync(`/proc/${d}/stat`, 'utf8');
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      parents.set(Number(d), ppid);
    } catch {
      /* exited meanwhile */
    }
  }
  const tree = [root];
  for (let k = 0; k < tree.length; k++) for (const [pid, ppid] of parents) if (ppid === tree[k]) tree.push(pid);
  for (const pid of tree.reverse()) {
    try {
      process.kill(pid, 'SIGKILL');
    } catch {
      /* already gone */
    }
  }
  await w.stop();
  return tree.length;
}

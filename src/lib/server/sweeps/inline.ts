/**
 * Runs a whole sweep inside the calling process, without Redis or workers, through the same
 * chunk ledger and finalize code as the workers. For the demo seed (a small completed sweep
 * exists before any worker runs) and benchmarks; never on a request path.
 */
import { paretoRanks } from '../../sweep/pareto';
import { evaluateChunk, prepareSweep } from './engine';
import { completeSweep } from './finalize';
import { withConnection } from './pool';
import { commitChunk, loadSweepRow } from './store';

export async function runSweepInline(sweepId: number) {
  const s = await loadSweepRow(sweepId);
  if (!s) throw new Error(`sweep ${sweepId} not found`);
  await withConnection((c) =>
    c.query("UPDATE sweeps SET status = 'queued', queued_at = COALESCE(queued_at, UTC_TIMESTAMP()) WHERE id = ? AND status = 'draft'", [sweepId])
  );
  const p = prepareSweep(s.spec);
  for (let chunk = 0; chunk < s.chunkCount; chunk++) {
    const start = chunk * s.chunkSize;
    await commitChunk(sweepId, evaluateChunk(p, chunk, start, Math.min(s.totalCases, start + s.chunkSize)), 1);
  }
  const after = await loadSweepRow(sweepId);
  if (!after?.finalizeClaimed) throw new Error(`sweep ${sweepId}: not every chunk was stored`);
  // The seed has no one to tell: mark the owner as notified.
  await withConnection((c) => c.query('UPDATE sweeps SET notified_at = UTC_TIMESTAMP() WHERE id = ?', [sweepId]));
  return completeSweep(after, p.spec, async (o, d) => paretoRanks(o, d));
}

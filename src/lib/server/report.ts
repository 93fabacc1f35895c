/**
 * What a sweep's report shows (the page in the app and the shared copy): the sweep's status
 * and frozen spec, the front, and the top options by the first objective among the front.
 */
import type { Sweep } from './db/models';
import { casePage, front, parseCaseQuery } from './sweeps/results';
import { sweepView } from './sweeps/service';

/** Options listed in the report's table. */
export const TOP_OPTIONS = 10;
/** Cases drawn behind the front. */
const CLOUD = 1000;

export async function reportData(sweep: Sweep) {
  const view = sweepView(sweep, { spec: true });
  const first = view.objectives[0];
  const sortable = new Set(['glow', 'payloadMass', 'payloadFraction', 'dryMass', 'propellantMass', 'maxDynamicPressure', 'maxAxialAcceleration', 'totalLosses', 'requiredDeltaV']);
  const q = new URLSearchParams({ limit: String(TOP_OPTIONS), feasible: '1' });
  // Completed: the best-ranked options (front first); still running: the best on the first objective.
  if (view.status === 'completed') q.set('sort', 'paretoRank');
  else if (first && sortable.has(first.metric)) {
    q.set('sort', first.metric);
    q.set('dir', first.direction === 'min' ? 'asc' : 'desc');
  }
  // Cases behind the front: all of a small sweep, else four runs spread over the case order.
  const done = view.counts.done;
  const slices = done <= CLOUD ? [0] : [0, 1, 2, 3].map((k) => Math.floor((k * (done - CLOUD / 4)) / 3));
  const limit = String(done <= CLOUD ? CLOUD : CLOUD / 4);
  const [f, top, ...pages] = await Promise.all([
    front(sweep),
    casePage(sweep, parseCaseQuery(q)),
    ...slices.map((o) => casePage(sweep, parseCaseQuery(new URLSearchParams({ limit, offset: String(o) }))))
  ]);
  const cloud = { cases: pages.flatMap((p) => p.cases) };
  return {
    sweep: {
      id: view.id,
      name: view.name,
      question: view.question,
      status: view.status,
      mode: view.mode,
      counts: view.counts,
      objectives: view.objectives,
      modelVersion: view.modelVersion,
      summary: view.summary,
      spec: view.spec!,
      createdAt: view.createdAt,
      finishedAt: view.finishedAt
    },
    front: { live: f.live, size: f.size, truncated: f.truncated, cases: f.cases },
    cloud: cloud.cases,
    top: top.cases
  };
}
export type ReportData = Awaited<ReturnType<typeof reportData>>;

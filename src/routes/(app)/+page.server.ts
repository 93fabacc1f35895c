import { Membership } from '$lib/server/db/models';
import { fn, col, Op } from 'sequelize';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ parent }) => {
  const { workspaces } = await parent();
  const ids = workspaces.map((w) => w.id);
  const counts = ids.length
    ? ((await Membership.findAll({
        attributes: ['workspaceId', [fn('COUNT', col('id')), 'members']],
        where: { workspaceId: { [Op.in]: ids } },
        group: ['workspaceId'],
        raw: true
      })) as unknown as { workspaceId: string; members: number }[])
    : [];
  const members = new Map(counts.map((c) => [c.workspaceId, Number(c.members)]));
  return {
    cards: workspaces.map((w) => ({ ...w, members: members.get(w.id) ?? 0 }))
  };
};

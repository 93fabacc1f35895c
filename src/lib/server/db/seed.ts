/**
 * Demo seed: an invented scenario. Tarnwick Orbital is a fictional launch company flying
 * from the fictional Cape Tarnwick range; every name and figure here is made up for the demo.
 * Idempotent: running it twice leaves the same rows.
 */
import { hashPassword } from '../password';
import { Membership, User, Workspace, type Role } from './models';
import { seedCatalogue } from './seed-catalogue';
import { seedDemoSweeps } from '../sweeps/seed-demo';

export const DEMO_PASSWORD = 'loftwise-demo';

export const DEMO_USERS: { email: string; displayName: string; role: Role }[] = [
  { email: 'admin@tarnwick.example', displayName: 'Dana Quill', role: 'admin' },
  { email: 'engineer@tarnwick.example', displayName: 'Ravi Tern', role: 'engineer' },
  { email: 'viewer@tarnwick.example', displayName: 'Mo Lindqvist', role: 'viewer' }
];

export const DEMO_WORKSPACES = [
  {
    slug: 'small-launcher',
    name: 'Tarnwick Orbital · Small Launcher',
    description:
      'Trades for the Fennel-2, a two-stage small launcher flying from Cape Tarnwick (34.6° N): propellant, structure and thrust-to-weight for 500 kg to a 500 km sun-synchronous orbit.'
  },
  {
    slug: 'heavy-concepts',
    name: 'Tarnwick Orbital · Heavy Concepts',
    description: 'Early three-stage concepts (Thistle-3) for 4 t to a 500 km, 53° orbit. Engineers only.'
  }
];

async function upsertUser(email: string, displayName: string, passwordHash: string) {
  const [user] = await User.findOrCreate({ where: { email }, defaults: { email, displayName, passwordHash } });
  return user;
}

export async function seedDemo() {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const users = new Map<string, User>();
  for (const u of DEMO_USERS) users.set(u.email, await upsertUser(u.email, u.displayName, passwordHash));

  const workspaces = new Map<string, Workspace>();
  for (const w of DEMO_WORKSPACES) {
    const [ws] = await Workspace.findOrCreate({ where: { slug: w.slug }, defaults: w });
    workspaces.set(w.slug, ws);
  }

  const grant = async (email: string, slug: string, role: Role) => {
    const userId = users.get(email)!.id;
    const workspaceId = workspaces.get(slug)!.id;
    await Membership.findOrCreate({ where: { userId, workspaceId }, defaults: { userId, workspaceId, role } });
  };
  for (const u of DEMO_USERS) await grant(u.email, 'small-launcher', u.role);
  await grant('admin@tarnwick.example', 'heavy-concepts', 'admin');
  await grant('engineer@tarnwick.example', 'heavy-concepts', 'engineer');

  await seedCatalogue(workspaces);
  await seedDemoSweeps(users, workspaces);

  return { users, workspaces };
}

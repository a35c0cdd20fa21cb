/**
 * Who may reach which route, in one table keyed by SvelteKit route id and HTTP method.
 * The guard in hooks.server.ts refuses any route missing here, and the access-matrix test
 * checks that every route file in src/routes has an entry, so a new route cannot be forgotten.
 * Finer rules (a client sees only their own cases) live in the services.
 */
import type { Role } from '../roles';

export type Audience = 'public' | readonly Role[];
type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

const everyone: readonly Role[] = ['admin', 'technician', 'supervisor', 'client'];
const staff: readonly Role[] = ['admin', 'technician', 'supervisor'];
const editors: readonly Role[] = ['admin', 'technician'];
const admins: readonly Role[] = ['admin'];
// Technical review and release: supervisors, and admins who can do everything (issue 6 §2, §3).
const reviewers: readonly Role[] = ['admin', 'supervisor'];
const clients: readonly Role[] = ['client'];

export const ROUTE_ACCESS: Record<string, Partial<Record<Method, Audience>>> = {
	'/': { GET: everyone },
	'/signin': { GET: 'public', POST: 'public' },
	'/signout': { POST: 'public' },
	'/cases': { GET: everyone },
	'/cases/new': { GET: editors, POST: editors },
	'/cases/[id=id]': { GET: everyone, POST: editors },
	// The item workbench: whoever sees the case sees the original; the run history shows only to
	// staff (the page leaves it out for clients) and only technicians and admins queue runs.
	'/cases/[id=id]/items/[itemId=id]': { GET: everyone, POST: editors },
	'/admin/users': { GET: admins, POST: admins },
	'/api/me': { GET: everyone },
	'/api/cases': { GET: everyone, POST: editors },
	'/api/cases/[id=id]': { GET: everyone },
	'/api/users': { GET: staff, POST: admins },
	'/api/users/[id=id]': { PATCH: admins },
	// Originals: technicians and admins upload; whoever sees the case reads its items (clients
	// only in cases they are members of, which the item service checks).
	'/api/cases/[id=id]/items': { GET: everyone, POST: editors },
	'/api/items/[id=id]': { GET: everyone },
	'/api/items/[id=id]/preview': { GET: everyone },
	'/api/items/[id=id]/original': { GET: everyone },
	// The zoom view's tiles and full-resolution regions: display values, the preview's audience.
	'/api/items/[id=id]/tiles': { GET: everyone },
	'/api/items/[id=id]/tiles/[level]/[column]/[row]': { GET: everyone },
	'/api/items/[id=id]/region': { GET: everyone },
	// Runs: staff read; technicians and admins request, cancel and replay. Clients never reach a
	// run: a released result comes to them through /api/portal/items/… (issue 6 §5).
	'/api/items/[id=id]/runs': { GET: staff, POST: editors },
	'/api/items/[id=id]/estimate': { POST: ['admin', 'technician', 'supervisor'] },
	// Kernels from pictures (issue 5): a point light's streak in the original, or an uploaded PSF
	// image; computed on request and not stored, so the staff who may ask for an estimate.
	'/api/items/[id=id]/streak': { POST: staff },
	'/api/kernels/from-image': { POST: staff },
	'/api/runs/[id=id]': { GET: staff },
	'/api/runs/[id=id]/result': { GET: staff },
	'/api/runs/[id=id]/preview': { GET: staff },
	'/api/runs/[id=id]/replay': { POST: editors },
	'/api/runs/[id=id]/cancel': { POST: editors },
	'/api/cases/[id=id]/custody': { GET: staff },
	'/api/items/[id=id]/custody': { GET: staff },
	'/api/items/[id=id]/premis': { GET: staff },
	'/api/custody/verify': { GET: staff },
	'/custody': { GET: staff, POST: staff },
	'/profile': { GET: everyone, POST: everyone },
	'/api/tokens': { GET: everyone, POST: everyone },
	'/api/tokens/[id=id]': { DELETE: everyone },
	// Review and release (issue 6). Technicians read a proposal's page (their e-mails link to it);
	// only reviewers decide or release. The portal is the clients' own view of released items,
	// and the services answer 404 for anything not released to the caller.
	'/runs/[id=id]/submit': { GET: editors, POST: editors },
	'/review': { GET: reviewers },
	'/review/[id=id]': { GET: staff, POST: reviewers },
	'/api/runs/[id=id]/proposals': { POST: editors },
	'/api/proposals': { GET: reviewers },
	'/api/proposals/[id=id]': { GET: staff },
	'/api/proposals/[id=id]/approve': { POST: reviewers },
	'/api/proposals/[id=id]/return': { POST: reviewers },
	'/api/proposals/[id=id]/release': { POST: reviewers },
	// The released report for the lab's staff; clients get theirs through the portal.
	'/api/proposals/[id=id]/report': { GET: staff },
	'/portal': { GET: clients },
	'/portal/items/[id=id]': { GET: clients },
	'/api/portal/items/[id=id]/report': { GET: clients },
	'/api/portal/items/[id=id]/result': { GET: clients },
	'/api/portal/items/[id=id]/png': { GET: clients },
	'/api/portal/items/[id=id]/before': { GET: clients },
	'/api/portal/items/[id=id]/after': { GET: clients },
	// Anyone holding a report may check it, signed in or not (issue 6 §6).
	'/verify': { GET: 'public', POST: 'public' },
	'/api/verify': { POST: 'public' },
	'/dev/mailbox': { GET: everyone },
	'/api/dev/mailbox': { GET: everyone }
};

export type AccessDecision = 'allow' | 'anonymous' | 'forbidden' | 'unlisted' | 'method';

/** The methods a route serves, for a 405's Allow header. */
export function allowedMethods(routeId: string): string[] {
	const methods = Object.keys(ROUTE_ACCESS[routeId] ?? {});
	return methods.includes('GET') ? [...methods, 'HEAD'] : methods;
}

export function decideAccess(routeId: string, method: string, role: Role | undefined): AccessDecision {
	const byMethod = ROUTE_ACCESS[routeId];
	// HEAD follows GET, as SvelteKit serves it.
	const audience = byMethod?.[(method === 'HEAD' ? 'GET' : method) as Method];
	if (!byMethod) return 'unlisted';
	// A method the route does not serve at all is the same answer for everyone (405, RFC 9110 §15.5.6).
	if (!audience) return 'method';
	if (audience === 'public') return 'allow';
	if (!role) return 'anonymous';
	return audience.includes(role) ? 'allow' : 'forbidden';
}

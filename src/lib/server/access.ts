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

export const ROUTE_ACCESS: Record<string, Partial<Record<Method, Audience>>> = {
	'/': { GET: everyone },
	'/signin': { GET: 'public', POST: 'public' },
	'/signout': { POST: 'public' },
	'/cases': { GET: everyone },
	'/cases/new': { GET: editors, POST: editors },
	'/cases/[id=id]': { GET: everyone, POST: editors },
	'/admin/users': { GET: admins, POST: admins },
	'/api/me': { GET: everyone },
	'/api/cases': { GET: everyone, POST: editors },
	'/api/cases/[id=id]': { GET: everyone },
	'/api/users': { GET: staff, POST: admins },
	'/api/users/[id=id]': { PATCH: admins }
};

export type AccessDecision = 'allow' | 'anonymous' | 'forbidden' | 'unlisted';

export function decideAccess(routeId: string, method: string, role: Role | undefined): AccessDecision {
	const byMethod = ROUTE_ACCESS[routeId];
	// HEAD follows GET, as SvelteKit serves it.
	const audience = byMethod?.[(method === 'HEAD' ? 'GET' : method) as Method];
	if (!byMethod) return 'unlisted';
	if (!audience) return role ? 'forbidden' : 'anonymous';
	if (audience === 'public') return 'allow';
	if (!role) return 'anonymous';
	return audience.includes(role) ? 'allow' : 'forbidden';
}

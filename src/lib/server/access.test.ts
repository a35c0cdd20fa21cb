import { describe, expect, it } from 'vitest';
import { allowedMethods, decideAccess } from './access';

// Status semantics from RFC 9110 §15.5.4 (403), §15.5.6 (405, with Allow) and §15.5.2 (401).
describe('decideAccess', () => {
	it('a method the route does not serve is 405 for everyone, signed in or not', () => {
		expect(decideAccess('/api/cases', 'DELETE', 'admin')).toBe('method');
		expect(decideAccess('/api/cases', 'DELETE', undefined)).toBe('method');
	});

	it('a served method the role may not use is forbidden; without a session, sign in first', () => {
		expect(decideAccess('/api/users', 'GET', 'client')).toBe('forbidden');
		expect(decideAccess('/api/users', 'GET', undefined)).toBe('anonymous');
	});

	it('HEAD follows GET, and an unknown route is unlisted', () => {
		expect(decideAccess('/api/cases', 'HEAD', 'technician')).toBe('allow');
		expect(decideAccess('/api/nowhere', 'GET', 'admin')).toBe('unlisted');
	});

	it('the Allow header lists the served methods and HEAD with GET', () => {
		expect(allowedMethods('/api/cases').sort()).toEqual(['GET', 'HEAD', 'POST']);
	});
});

/** Values the global setup hands to every integration test file through vitest's provide/inject. */
import { inject } from 'vitest';

declare module 'vitest' {
	export interface ProvidedContext {
		/** Where the built app listens, e.g. http://127.0.0.1:4310 (no trailing slash). */
		baseURL: string;
		/** The suite's own database, migrated and seeded with the demo scenario. */
		databaseName: string;
		/** Redis key prefix the test server uses (sign-in failure counters live under it). */
		queuePrefix: string;
		/** Failed sign-ins the server allows per e-mail before refusing even the right password. */
		signInMaxFailures: number;
	}
}

export const baseURL = (): string => inject('baseURL');
export const databaseName = (): string => inject('databaseName');
export const queuePrefix = (): string => inject('queuePrefix');
export const signInMaxFailures = (): number => inject('signInMaxFailures');

/** Time behind an interface so services can be tested with a fixed clock. */
export interface Clock {
	now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

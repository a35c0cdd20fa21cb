/** Domain errors raised by services; routes map them to HTTP statuses in one place. */
export class DomainError extends Error {
	constructor(
		message: string,
		readonly status: 400 | 403 | 404 | 409 | 413 | 415 | 422,
		readonly fields?: Record<string, string[]>
	) {
		super(message);
		this.name = new.target.name;
	}
}

export class NotFoundError extends DomainError {
	constructor(what: string) {
		super(`${what} not found`, 404);
	}
}

export class ForbiddenError extends DomainError {
	constructor(message = 'You do not have permission for this') {
		super(message, 403);
	}
}

export class InvalidError extends DomainError {
	constructor(message: string, fields?: Record<string, string[]>) {
		super(message, 400, fields);
	}
}

export class ConflictError extends DomainError {
	constructor(message: string, fields?: Record<string, string[]>) {
		super(message, 409, fields);
	}
}

/** An upload or a decoded image larger than the configured limit (bytes or pixels). */
export class TooLargeError extends DomainError {
	constructor(message: string) {
		super(message, 413);
	}
}

/** Content of a type Stillpoint does not take, recognised from the bytes themselves. */
export class UnsupportedMediaError extends DomainError {
	constructor(message: string) {
		super(message, 415);
	}
}

/** Content of an accepted type that cannot be read through: truncated or corrupt. */
export class UnprocessableError extends DomainError {
	constructor(message: string) {
		super(message, 422);
	}
}

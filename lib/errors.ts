// Domain errors: thrown by lib/ functions, turned into statuses and plain messages in one place (lib/http/route.ts).
export class DomainError extends Error {
  readonly status: number = 500;
  constructor(
    message: string,
    readonly fieldErrors?: Record<string, string[]>,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class Invalid extends DomainError {
  readonly status = 400;
}
export class Unauthorized extends DomainError {
  readonly status = 401;
  constructor(message = 'Sign in to continue.') {
    super(message);
  }
}
export class Forbidden extends DomainError {
  readonly status = 403;
  constructor(message = 'You do not have access to this.') {
    super(message);
  }
}
export class NotFound extends DomainError {
  readonly status = 404;
}
export class Conflict extends DomainError {
  readonly status = 409;
}
export class TooManyRequests extends DomainError {
  readonly status = 429;
}

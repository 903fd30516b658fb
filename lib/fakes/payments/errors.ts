// Error values in the API's own shape: { error: { type, code, decline_code, message, param } }.

export type ErrorType =
  | 'invalid_request_error'
  | 'card_error'
  | 'api_error'
  | 'idempotency_error'
  | 'authentication_error';

export interface ErrorBody {
  type: ErrorType;
  message: string;
  code?: string;
  decline_code?: string;
  param?: string;
  [extra: string]: unknown;
}

export class ApiError extends Error {
  readonly status: number;
  readonly body: ErrorBody;
  /**
   * Errors found while checking the request's parameters are not stored under an
   * idempotency key (the request never started executing), so a corrected retry
   * with the same key works. Errors raised by the operation itself are stored.
   */
  readonly savedUnderIdempotencyKey: boolean;

  constructor(status: number, body: ErrorBody, savedUnderIdempotencyKey: boolean) {
    super(body.message);
    this.status = status;
    this.body = body;
    this.savedUnderIdempotencyKey = savedUnderIdempotencyKey;
  }
}

/** A parameter is missing or malformed: 400, not stored under an idempotency key. */
export function invalidParam(param: string, message: string, code?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', message, param, ...(code ? { code } : {}) }, false);
}

export function missingParam(param: string): ApiError {
  return invalidParam(param, `Missing required param: ${param}.`, 'parameter_missing');
}

/** A referenced object does not exist. Path ids give 404, body references give 400. */
export function noSuch(kind: string, id: string, param: string, status: 400 | 404 = 400): ApiError {
  return new ApiError(
    status,
    { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param },
    false,
  );
}

/** The request was well formed but the objects' state forbids it: 400, stored like a success. */
export function stateError(code: string, message: string, param?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', code, message, ...(param ? { param } : {}) }, true);
}

/**
 * The provider's error envelope: `{ error: { type, code, decline_code?, message, param? } }`
 * with the status that tells the SDK which error class to raise.
 */
export type ErrorType =
  | 'invalid_request_error'
  | 'authentication_error'
  | 'card_error'
  | 'idempotency_error'
  | 'permission_error'
  | 'rate_limit_error'
  | 'api_error';

export interface ErrorBody {
  type: ErrorType;
  code?: string;
  decline_code?: string;
  message: string;
  param?: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody,
  ) {
    super(body.message);
  }

  toJSON() {
    return { error: this.body };
  }
}

export const invalidRequest = (message: string, extra: { code?: string; param?: string } = {}) =>
  new ApiError(400, { type: 'invalid_request_error', message, ...extra });

export const missingParam = (param: string) =>
  invalidRequest(`Missing required param: ${param}.`, { code: 'parameter_missing', param });

export const invalidParam = (param: string, message: string) =>
  invalidRequest(message, { code: 'parameter_invalid', param });

export const noSuch = (kind: string, id: string, param = 'id') =>
  new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', param, message: `No such ${kind}: '${id}'` });

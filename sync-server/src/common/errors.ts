import { BadRequestException, NotFoundException, UnauthorizedException } from '@nestjs/common';

/** Why a request was not authenticated: clients re-authenticate on any of these. */
export type AuthFailure = 'token_missing' | 'token_expired' | 'token_invalid' | 'refresh_reused' | 'bad_credentials';

/** 401 with `details.reason`, so an offline client knows to sign in again when back online. */
export function unauthorized(reason: AuthFailure, message: string): UnauthorizedException {
  return new UnauthorizedException({ message, details: { reason } });
}

/** 400 for one field, in the same shape as the validation pipe's errors. */
export function fieldError(path: string, problem: string): BadRequestException {
  return new BadRequestException({
    message: `Request validation failed at ${path}: ${problem}`,
    details: [{ path, problems: [problem] }],
  });
}

/** The one answer for a project the caller may not see, whether or not it exists. */
export function projectNotFound(): NotFoundException {
  return new NotFoundException({ message: 'No such project', details: null });
}

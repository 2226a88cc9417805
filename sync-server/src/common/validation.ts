import { BadRequestException, ValidationPipe, type ValidationError } from '@nestjs/common';

export interface FieldProblem {
  /** Dotted path of the field in the request body/query, e.g. "axes.0.from". */
  path: string;
  problems: string[];
}

/** Flatten class-validator's tree into one entry per field that failed. */
export function flattenValidationErrors(errors: ValidationError[], prefix = ''): FieldProblem[] {
  const out: FieldProblem[] = [];
  for (const e of errors) {
    const path = prefix ? `${prefix}.${e.property}` : e.property;
    if (e.constraints) out.push({ path, problems: Object.values(e.constraints) });
    if (e.children?.length) out.push(...flattenValidationErrors(e.children, path));
  }
  return out;
}

/** The global pipe: unknown fields are rejected, payloads become DTO instances. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    exceptionFactory: (errors) => {
      const details = flattenValidationErrors(errors);
      const first = details[0];
      const message = first
        ? `Request validation failed at ${first.path}: ${first.problems.join('; ')}`
        : 'Request validation failed';
      return new BadRequestException({ message, details });
    },
  });
}

import { registerDecorator, type ValidationArguments, type ValidationOptions } from 'class-validator';

export const PASSWORD_MIN_LENGTH = 10;
export const PASSWORD_MAX_LENGTH = 128;
const MIN_DISTINCT = 5;

/**
 * Why a password is too weak, or null. The rule (common practice, after NIST SP 800-63B: length
 * over composition): 10–128 characters, at least 5 different characters, and not the e-mail
 * address or its local part.
 */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `must be at least ${PASSWORD_MIN_LENGTH} characters long`;
  if (password.length > PASSWORD_MAX_LENGTH) return `must be at most ${PASSWORD_MAX_LENGTH} characters long`;
  if (new Set(password).size < MIN_DISTINCT) return `must contain at least ${MIN_DISTINCT} different characters`;
  if (email) {
    const lower = password.toLowerCase();
    const address = email.trim().toLowerCase();
    const local = address.split('@')[0] ?? '';
    if (lower === address || (local.length >= 4 && lower.includes(local))) return 'must not contain your e-mail address';
  }
  return null;
}

/** class-validator decorator for passwordProblem(); reads the e-mail from `emailField` when given. */
export function IsAcceptablePassword(emailField?: string, options?: ValidationOptions) {
  return (target: object, propertyName: string) => {
    registerDecorator({
      name: 'isAcceptablePassword',
      target: target.constructor,
      propertyName,
      options,
      validator: {
        validate(value: unknown, args: ValidationArguments) {
          if (typeof value !== 'string') return false;
          const email = emailField ? (args.object as Record<string, unknown>)[emailField] : undefined;
          return passwordProblem(value, typeof email === 'string' ? email : undefined) === null;
        },
        defaultMessage(args: ValidationArguments) {
          if (typeof args.value !== 'string') return `${args.property} must be a string`;
          const email = emailField ? (args.object as Record<string, unknown>)[emailField] : undefined;
          return `${args.property} ${passwordProblem(args.value, typeof email === 'string' ? email : undefined) ?? 'is not acceptable'}`;
        },
      },
    });
  };
}

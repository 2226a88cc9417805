import { Transform } from 'class-transformer';

/** Trim strings; other types pass unchanged so the validators can name them. */
export const Trim = () => Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value));

import { Description, Field, Input, Label, Select } from '@headlessui/react';
import type { ReactNode } from 'react';

/** Problems found at a JSON path, shown under the field that the path names. */
export function FieldErrors({ messages }: { messages: string[] }) {
  if (messages.length === 0) return null;
  return (
    <Description as="div" className="mt-1 space-y-0.5 text-xs font-medium text-red-800" data-field-error="">
      {messages.map((m) => (
        <p key={m}>{m}</p>
      ))}
    </Description>
  );
}

const inputClass =
  'mt-1 block w-full rounded-md border bg-surface px-2.5 py-1.5 text-sm text-ink-950 outline-none data-focus:border-ink-700 data-focus:ring-2 data-focus:ring-accent-300';

interface TextFieldProps {
  label: ReactNode;
  value: string;
  onChange: (value: string) => void;
  errors?: string[];
  /** JSON path of the value (for tests and for finding the field of an error). */
  path: string;
  hint?: ReactNode;
  className?: string;
  inputMode?: 'decimal' | 'numeric' | 'text';
  placeholder?: string;
  type?: 'text' | 'email' | 'password';
  autoComplete?: string;
  required?: boolean;
}

export function TextField({ label, value, onChange, errors = [], path, hint, className = '', inputMode, placeholder, type = 'text', autoComplete = 'off', required }: TextFieldProps) {
  const bad = errors.length > 0;
  return (
    <Field className={className}>
      <Label className="text-xs font-semibold tracking-wide text-ink-700">{label}</Label>
      <Input
        value={value}
        onChange={(e) => onChange(e.target.value)}
        invalid={bad}
        data-path={path}
        inputMode={inputMode}
        placeholder={placeholder}
        spellCheck={false}
        type={type}
        required={required}
        autoComplete={autoComplete}
        className={`${inputClass} ${bad ? 'border-red-500' : 'border-line'}`}
      />
      {hint && !bad ? <Description className="mt-1 text-xs text-ink-600">{hint}</Description> : null}
      <FieldErrors messages={errors} />
    </Field>
  );
}

interface SelectFieldProps<T extends string> {
  label: ReactNode;
  value: T | '';
  options: readonly { value: T; label: string }[];
  onChange: (value: T) => void;
  errors?: string[];
  path: string;
  className?: string;
}

export function SelectField<T extends string>({ label, value, options, onChange, errors = [], path, className = '' }: SelectFieldProps<T>) {
  const bad = errors.length > 0;
  return (
    <Field className={className}>
      <Label className="text-xs font-semibold tracking-wide text-ink-700">{label}</Label>
      <Select
        value={value}
        onChange={(e) => onChange(e.target.value as T)}
        invalid={bad}
        data-path={path}
        className={`${inputClass} ${bad ? 'border-red-500' : 'border-line'}`}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </Select>
      <FieldErrors messages={errors} />
    </Field>
  );
}

import type { InputHTMLAttributes, ReactNode, Ref, SelectHTMLAttributes } from 'react';

export const inputClass =
  'w-full rounded-plate border border-line bg-surface px-3 py-2 text-base text-ink placeholder:text-muted focus:border-verdigris focus:outline-none aria-[invalid=true]:border-signal sm:text-sm';

export function Field({
  label,
  name,
  error,
  hint,
  children,
}: {
  label: string;
  name: string;
  error?: string;
  hint?: ReactNode;
  children: ReactNode;
}) {
  return (
    <div className="space-y-1">
      <label htmlFor={name} className="block text-sm font-semibold text-ink">
        {label}
      </label>
      {children}
      {hint && !error ? <p className="text-xs text-muted">{hint}</p> : null}
      {error ? (
        <p id={`${name}-error`} className="text-sm text-signal" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function TextInput({
  name,
  error,
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { name: string; error?: string }) {
  return (
    <input
      id={name}
      name={name}
      aria-invalid={error ? true : undefined}
      aria-describedby={error ? `${name}-error` : undefined}
      className={inputClass}
      {...props}
    />
  );
}

export function Select({
  name,
  error,
  children,
  ...props
}: SelectHTMLAttributes<HTMLSelectElement> & { name: string; error?: string; ref?: Ref<HTMLSelectElement> }) {
  return (
    <select
      id={name}
      name={name}
      aria-invalid={error ? true : undefined}
      className={inputClass}
      {...props}
    >
      {children}
    </select>
  );
}

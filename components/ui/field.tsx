import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from "react";

const control =
  "mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-faint focus:border-accent aria-[invalid=true]:border-bad";

interface FieldProps {
  label: string;
  name: string;
  error?: string;
  hint?: ReactNode;
}

function Wrap({ label, name, error, hint, children }: FieldProps & { children: ReactNode }) {
  return (
    <div className="mb-4">
      <label htmlFor={name} className="block text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${name}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${name}-error`} role="alert" className="mt-1 text-xs font-medium text-bad">
          {error}
        </p>
      ) : null}
    </div>
  );
}

const described = (name: string, error?: string, hint?: ReactNode) =>
  error ? `${name}-error` : hint ? `${name}-hint` : undefined;

export function TextField({ label, name, error, hint, ...rest }: FieldProps & InputHTMLAttributes<HTMLInputElement>) {
  return (
    <Wrap label={label} name={name} error={error} hint={hint}>
      <input id={name} name={name} aria-invalid={error ? true : undefined} aria-describedby={described(name, error, hint)} className={control} {...rest} />
    </Wrap>
  );
}

export function TextArea({ label, name, error, hint, ...rest }: FieldProps & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return (
    <Wrap label={label} name={name} error={error} hint={hint}>
      <textarea id={name} name={name} aria-invalid={error ? true : undefined} aria-describedby={described(name, error, hint)} className={control} {...rest} />
    </Wrap>
  );
}

export function SelectField({
  label,
  name,
  error,
  hint,
  children,
  ...rest
}: FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { children: ReactNode }) {
  return (
    <Wrap label={label} name={name} error={error} hint={hint}>
      <select id={name} name={name} aria-invalid={error ? true : undefined} aria-describedby={described(name, error, hint)} className={control} {...rest}>
        {children}
      </select>
    </Wrap>
  );
}

export function FormMessage({ kind, children }: { kind: "error" | "info" | "ok"; children: ReactNode }) {
  const cls = kind === "error" ? "border-bad bg-bad-wash text-bad" : kind === "ok" ? "border-ok bg-ok-wash text-ok" : "border-info bg-info-wash text-info";
  return (
    <div role={kind === "error" ? "alert" : "status"} className={`mb-4 border-l-4 px-3 py-2 text-sm ${cls}`}>
      {children}
    </div>
  );
}

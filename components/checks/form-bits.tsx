"use client";

import type { ReactNode, SelectHTMLAttributes, InputHTMLAttributes } from "react";
import { get, useFormContext, type FieldValues } from "react-hook-form";
import { unitLabel } from "@/lib/checks/quantities";

// Small controls for the dense check forms: a number with its unit select, a select, a
// checkbox, each showing its field's message (zod, before submit; the server's, after).

export const inputCls =
  "block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-sm text-ink placeholder:text-ink-faint focus:border-accent aria-[invalid=true]:border-bad";
export const selectCls = "rounded-sm border border-rule-strong bg-sheet px-1.5 py-1 text-sm text-ink focus:border-accent aria-[invalid=true]:border-bad";

export function useFieldError(name: string): string | undefined {
  const { formState } = useFormContext<FieldValues>();
  const e = get(formState.errors, name) as { message?: string } | undefined;
  return typeof e?.message === "string" ? e.message : undefined;
}

export function ErrorText({ name, className = "" }: { name: string; className?: string }) {
  const message = useFieldError(name);
  if (!message) return null;
  return (
    <p role="alert" id={`${name}-error`} className={`mt-0.5 text-xs font-medium text-bad ${className}`}>
      {message}
    </p>
  );
}

export function Labelled({ label, htmlFor, children, hint }: { label: string; htmlFor: string; children: ReactNode; hint?: ReactNode }) {
  return (
    <div className="min-w-0">
      <label htmlFor={htmlFor} className="block text-xs font-medium text-ink-soft">
        {label}
      </label>
      <div className="mt-0.5">{children}</div>
      {hint ? <p className="mt-0.5 text-xs text-ink-faint">{hint}</p> : null}
    </div>
  );
}

/** A number field with its unit select beside it. */
export function QuantityField({
  label,
  name,
  unitName,
  units,
  hint,
  placeholder,
  inputProps,
}: {
  label: string;
  name: string;
  unitName?: string;
  units?: readonly string[];
  hint?: ReactNode;
  placeholder?: string;
  inputProps?: InputHTMLAttributes<HTMLInputElement>;
}) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  const id = name.replace(/\./g, "-");
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
        {label}
      </label>
      <div className="mt-0.5 flex gap-1">
        <input id={id} inputMode="decimal" autoComplete="off" placeholder={placeholder} aria-invalid={error ? true : undefined} aria-describedby={error ? `${name}-error` : undefined} className={`${inputCls} num`} {...register(name)} {...inputProps} />
        {unitName && units ? (
          <select aria-label={`${label} unit`} className={selectCls} {...register(unitName)}>
            {units.map((u) => (
              <option key={u} value={u}>
                {unitLabel(u)}
              </option>
            ))}
          </select>
        ) : null}
      </div>
      {hint && !error ? <p className="mt-0.5 text-xs text-ink-faint">{hint}</p> : null}
      <ErrorText name={name} />
    </div>
  );
}

export function TextBox({ label, name, placeholder, hint }: { label: string; name: string; placeholder?: string; hint?: ReactNode }) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  const id = name.replace(/\./g, "-");
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
        {label}
      </label>
      <input id={id} autoComplete="off" placeholder={placeholder} aria-invalid={error ? true : undefined} aria-describedby={error ? `${name}-error` : undefined} className={`${inputCls} mt-0.5`} {...register(name)} />
      {hint && !error ? <p className="mt-0.5 text-xs text-ink-faint">{hint}</p> : null}
      <ErrorText name={name} />
    </div>
  );
}

export function SelectBox({
  label,
  name,
  options,
  hint,
  selectProps,
}: {
  label: string;
  name: string;
  options: readonly { value: string; label: string }[];
  hint?: ReactNode;
  selectProps?: SelectHTMLAttributes<HTMLSelectElement>;
}) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  const id = name.replace(/\./g, "-");
  const reg = register(name);
  const { onChange: extra, ...rest } = selectProps ?? {};
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        className={`${selectCls} mt-0.5 w-full`}
        {...rest}
        {...reg}
        onChange={(e) => {
          void reg.onChange(e);
          extra?.(e);
        }}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {hint && !error ? <p className="mt-0.5 text-xs text-ink-faint">{hint}</p> : null}
      <ErrorText name={name} />
    </div>
  );
}

export function CheckBox({ label, name, hint }: { label: string; name: string; hint?: ReactNode }) {
  const { register } = useFormContext<FieldValues>();
  const id = name.replace(/\./g, "-");
  return (
    <div>
      <label htmlFor={id} className="inline-flex items-center gap-2 text-sm">
        <input id={id} type="checkbox" className="h-4 w-4 accent-accent" {...register(name)} />
        {label}
      </label>
      {hint ? <p className="ml-6 text-xs text-ink-faint">{hint}</p> : null}
      <ErrorText name={name} />
    </div>
  );
}

export function Fieldset({ legend, children, actions }: { legend: string; children: ReactNode; actions?: ReactNode }) {
  return (
    <fieldset className="mb-4 border border-rule bg-sheet px-4 pb-4 pt-2">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      {actions ? <div className="mb-2 flex justify-end gap-2">{actions}</div> : null}
      {children}
    </fieldset>
  );
}

"use client";
// Labelled form controls for the recording forms, in the same style as components/ui/field:
// hint and errors tied to the control for screen readers, 48 px targets, logical properties.
import { useId, type ComponentProps, type ReactNode } from "react";

const box = (invalid: boolean) =>
  `min-h-12 w-full rounded-lg border-2 bg-paper-raised px-3 text-ink ${invalid ? "border-level-emergency" : "border-stone-line"}`;

function Described({
  id,
  label,
  hint,
  errors,
  children,
  className = "",
}: {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  errors?: string[];
  children: ReactNode;
  className?: string;
}) {
  return (
    <div className={`flex min-w-0 flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {children}
      {errors?.length ? (
        <p id={`${id}-error`} className="text-sm font-bold text-level-emergency-ink" role="alert">
          {errors.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

function describedBy(id: string, hint?: ReactNode, errors?: string[]) {
  return [hint ? `${id}-hint` : "", errors?.length ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined;
}

type Common = { label: ReactNode; hint?: ReactNode; errors?: string[]; className?: string };

export function TextInput({ label, hint, errors, className, unit, ...input }: Common & { unit?: string } & ComponentProps<"input">) {
  const auto = useId();
  const id = input.id ?? auto;
  const invalid = Boolean(errors?.length);
  return (
    <Described id={id} label={label} hint={hint} errors={errors} className={className}>
      <div className="flex items-center gap-2">
        <input id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy(id, hint, errors)} className={box(invalid)} {...input} />
        {unit ? (
          <span className="shrink-0 font-bold text-ink-soft" aria-hidden="true">
            {unit}
          </span>
        ) : null}
      </div>
    </Described>
  );
}

export function Select({
  label,
  hint,
  errors,
  className,
  options,
  placeholder,
  ...select
}: Common & { options: { value: string; label: string }[]; placeholder?: string } & ComponentProps<"select">) {
  const auto = useId();
  const id = select.id ?? auto;
  const invalid = Boolean(errors?.length);
  return (
    <Described id={id} label={label} hint={hint} errors={errors} className={className}>
      <select id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy(id, hint, errors)} className={box(invalid)} {...select}>
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Described>
  );
}

export function TextArea({ label, hint, errors, className, ...area }: Common & ComponentProps<"textarea">) {
  const auto = useId();
  const id = area.id ?? auto;
  const invalid = Boolean(errors?.length);
  return (
    <Described id={id} label={label} hint={hint} errors={errors} className={className}>
      <textarea
        id={id}
        rows={2}
        aria-invalid={invalid || undefined}
        aria-describedby={describedBy(id, hint, errors)}
        className={`${box(invalid)} py-2`}
        {...area}
      />
    </Described>
  );
}

export function Checkbox({ label, hint, errors, className = "", ...input }: Common & ComponentProps<"input">) {
  const auto = useId();
  const id = input.id ?? auto;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="flex min-h-12 cursor-pointer items-center gap-3 font-bold">
        <input id={id} type="checkbox" className="h-6 w-6 shrink-0 accent-brand" aria-describedby={describedBy(id, hint, errors)} {...input} />
        <span>{label}</span>
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="ps-9 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {errors?.length ? (
        <p id={`${id}-error`} className="text-sm font-bold text-level-emergency-ink" role="alert">
          {errors.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

/** A radio group; `inputProps` is what react-hook-form's register returns, shared by every option. */
export function RadioGroup({
  legend,
  hint,
  errors,
  options,
  inputProps,
  className = "",
}: {
  legend: ReactNode;
  hint?: ReactNode;
  errors?: string[];
  options: { value: string; label: string }[];
  inputProps: ComponentProps<"input">;
  className?: string;
}) {
  const id = useId();
  return (
    <fieldset className={`flex flex-col gap-1 ${className}`} aria-describedby={describedBy(id, hint, errors)}>
      <legend className="font-bold">{legend}</legend>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-x-6">
        {options.map((o) => (
          <label key={o.value} className="flex min-h-12 cursor-pointer items-center gap-3">
            <input type="radio" value={o.value} className="h-6 w-6 accent-brand" {...inputProps} />
            <span>{o.label}</span>
          </label>
        ))}
      </div>
      {errors?.length ? (
        <p id={`${id}-error`} className="text-sm font-bold text-level-emergency-ink" role="alert">
          {errors.join(" ")}
        </p>
      ) : null}
    </fieldset>
  );
}

/** A group of fields under a heading. */
export function Section({ title, children, className = "" }: { title: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-card border border-stone-faint bg-paper-raised p-4 md:p-5 ${className}`}>
      <h2 className="mb-4 text-xl font-bold text-brand">{title}</h2>
      <div className="grid gap-4 sm:grid-cols-2">{children}</div>
    </section>
  );
}

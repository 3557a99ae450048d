import { useId, type ReactNode, type SelectHTMLAttributes } from "react";

/** A labelled select with hint and errors announced to screen readers (the Field of choices). */
export function SelectField({
  label,
  hint,
  errors,
  className = "",
  children,
  ...select
}: SelectHTMLAttributes<HTMLSelectElement> & { label: ReactNode; hint?: ReactNode; errors?: string[] }) {
  const id = useId();
  const invalid = Boolean(errors?.length);
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={select.id ?? id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <select
        id={select.id ?? id}
        aria-invalid={invalid || undefined}
        aria-describedby={[hint ? `${id}-hint` : "", invalid ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined}
        className={`min-h-12 rounded-lg border-2 bg-paper-raised px-3 text-ink ${invalid ? "border-level-emergency" : "border-stone-line"}`}
        {...select}
      >
        {children}
      </select>
      {invalid ? (
        <p id={`${id}-error`} className="text-sm font-bold text-level-emergency-ink" role="alert">
          {errors!.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

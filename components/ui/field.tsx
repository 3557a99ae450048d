import { useId, type InputHTMLAttributes, type ReactNode } from "react";

/** A labelled input with its hint and error messages announced to screen readers. */
export function Field({
  label,
  hint,
  errors,
  className = "",
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { label: ReactNode; hint?: ReactNode; errors?: string[] }) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const invalid = Boolean(errors?.length);
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={input.id ?? id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <input
        id={input.id ?? id}
        aria-invalid={invalid || undefined}
        aria-describedby={[hint ? hintId : "", invalid ? errorId : ""].filter(Boolean).join(" ") || undefined}
        className={`min-h-12 rounded-lg border-2 bg-paper-raised px-3 text-ink ${invalid ? "border-level-emergency" : "border-stone-line"}`}
        {...input}
      />
      {invalid ? (
        <p id={errorId} className="text-sm font-bold text-level-emergency-ink" role="alert">
          {errors!.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

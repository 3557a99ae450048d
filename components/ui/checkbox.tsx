import { useId, type InputHTMLAttributes, type ReactNode } from "react";

/** A checkbox with its label as a 48 px tall target. */
export function Checkbox({ label, hint, className = "", ...input }: InputHTMLAttributes<HTMLInputElement> & { label: ReactNode; hint?: ReactNode }) {
  const id = useId();
  return (
    <div className={`flex flex-col ${className}`}>
      <label htmlFor={input.id ?? id} className="flex min-h-12 cursor-pointer items-center gap-3">
        <input id={input.id ?? id} type="checkbox" className="h-5 w-5 shrink-0 accent-brand" aria-describedby={hint ? `${id}-hint` : undefined} {...input} />
        <span>{label}</span>
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="ms-8 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

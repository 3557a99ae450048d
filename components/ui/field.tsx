// The form kit: every labelled control of every form. Hint and errors are tied to the control
// for screen readers (aria-describedby), targets are 48 px tall, and properties are logical so
// right-to-left pages mirror. Errors arrive as words (see useErrorText), never as codes.
import { useId, type ComponentProps, type ReactNode } from "react";

export type FieldProps = { label: ReactNode; hint?: ReactNode; errors?: string[]; className?: string };

const box = (invalid: boolean) =>
  `min-h-12 w-full rounded-lg border-2 bg-paper-raised px-3 text-ink ${invalid ? "border-level-emergency" : "border-stone-line"}`;

export function describedBy(id: string, hint?: ReactNode, errors?: string[]) {
  return [hint ? `${id}-hint` : "", errors?.length ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined;
}

/** A control's error words, announced as they appear. */
export function FieldError({ id, errors, className = "" }: { id?: string; errors?: string[]; className?: string }) {
  if (!errors?.length) return null;
  return (
    <p id={id} className={`text-sm font-bold text-level-emergency-ink ${className}`} role="alert">
      {errors.join(" ")}
    </p>
  );
}

export function FieldHint({ id, hint, className = "" }: { id: string; hint?: ReactNode; className?: string }) {
  return hint ? (
    <p id={id} className={`text-sm text-ink-soft ${className}`}>
      {hint}
    </p>
  ) : null;
}

function Labelled({ id, label, hint, errors, className = "", children }: FieldProps & { id: string; children: ReactNode }) {
  return (
    <div className={`flex min-w-0 flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      <FieldHint id={`${id}-hint`} hint={hint} />
      {children}
      <FieldError id={`${id}-error`} errors={errors} />
    </div>
  );
}

/**
 * E-mail addresses, phone numbers, numbers and codes are written left to right in every language:
 * inside an Arabic or Urdu page, "yusuf.haddad@" must not show as "@yusuf.haddad".
 */
export function inputDirection(input: Pick<ComponentProps<"input">, "dir" | "type" | "inputMode" | "autoComplete">): string | undefined {
  if (input.dir) return input.dir;
  const ltr =
    ["email", "tel", "url", "date", "time", "datetime-local", "number"].includes(input.type ?? "") ||
    ["email", "tel", "url", "numeric", "decimal"].includes(input.inputMode ?? "") ||
    /\b(one-time-code|email|username|tel)\b/.test(input.autoComplete ?? "");
  return ltr ? "ltr" : undefined;
}

/** A text, number, date or e-mail input; `unit` is shown after the box (and not read twice). */
export function Field({ label, hint, errors, className, unit, ...input }: FieldProps & { unit?: ReactNode } & ComponentProps<"input">) {
  const auto = useId();
  const id = input.id ?? auto;
  const invalid = Boolean(errors?.length);
  const control = (
    <input id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy(id, hint, errors)} className={box(invalid)} {...input} dir={inputDirection(input)} />
  );
  return (
    <Labelled id={id} label={label} hint={hint} errors={errors} className={className}>
      {unit ? (
        <div className="flex items-center gap-2">
          {control}
          <span className="shrink-0 font-bold text-ink-soft" aria-hidden="true">
            {unit}
          </span>
        </div>
      ) : (
        control
      )}
    </Labelled>
  );
}

export function TextArea({ label, hint, errors, className, ...area }: FieldProps & ComponentProps<"textarea">) {
  const auto = useId();
  const id = area.id ?? auto;
  const invalid = Boolean(errors?.length);
  return (
    <Labelled id={id} label={label} hint={hint} errors={errors} className={className}>
      <textarea id={id} rows={2} aria-invalid={invalid || undefined} aria-describedby={describedBy(id, hint, errors)} className={`${box(invalid)} py-2`} {...area} />
    </Labelled>
  );
}

/** A select from `options` (with an empty first choice when `placeholder` is given), or from its own `<option>` children. */
export function SelectField({
  label,
  hint,
  errors,
  className,
  options,
  placeholder,
  children,
  ...select
}: FieldProps & { options?: readonly { value: string; label: string }[]; placeholder?: string } & ComponentProps<"select">) {
  const auto = useId();
  const id = select.id ?? auto;
  const invalid = Boolean(errors?.length);
  return (
    <Labelled id={id} label={label} hint={hint} errors={errors} className={className}>
      <select id={id} aria-invalid={invalid || undefined} aria-describedby={describedBy(id, hint, errors)} className={box(invalid)} {...select}>
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options?.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
        {children}
      </select>
    </Labelled>
  );
}

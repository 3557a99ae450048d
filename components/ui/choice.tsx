// Choices of the form kit: a checkbox, a group of checkboxes or radios under a legend.
import { useId, type ComponentProps, type ReactNode } from "react";
import { describedBy, FieldError, FieldHint } from "./field";

/** A checkbox with its label as a 48 px tall target. */
export function Checkbox({ label, hint, errors, className = "", ...input }: { label: ReactNode; hint?: ReactNode; errors?: string[] } & ComponentProps<"input">) {
  const auto = useId();
  const id = input.id ?? auto;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="flex min-h-12 cursor-pointer items-center gap-3">
        <input id={id} type="checkbox" className="h-6 w-6 shrink-0 accent-brand" aria-describedby={describedBy(id, hint, errors)} {...input} />
        <span>{label}</span>
      </label>
      <FieldHint id={`${id}-hint`} hint={hint} className="ps-9" />
      <FieldError id={`${id}-error`} errors={errors} />
    </div>
  );
}

/** Several controls under one legend (checkboxes, radios), with the group's hint and errors. */
export function ChoiceGroup({
  legend,
  hint,
  errors,
  className = "",
  children,
}: {
  legend: ReactNode;
  hint?: ReactNode;
  errors?: string[];
  className?: string;
  children: ReactNode;
}) {
  const id = useId();
  const invalid = Boolean(errors?.length);
  return (
    <fieldset className={`flex flex-col gap-1 ${className}`} aria-describedby={describedBy(id, hint, errors)} aria-invalid={invalid || undefined}>
      <legend className="font-bold">{legend}</legend>
      <FieldHint id={`${id}-hint`} hint={hint} />
      <div className={invalid ? "rounded-lg border-2 border-level-emergency px-3" : undefined}>{children}</div>
      <FieldError id={`${id}-error`} errors={errors} />
    </fieldset>
  );
}

/** A radio group; `inputProps` is what react-hook-form's register returns, shared by every option. */
export function RadioGroup({
  options,
  inputProps,
  ...group
}: {
  legend: ReactNode;
  hint?: ReactNode;
  errors?: string[];
  options: readonly { value: string; label: string }[];
  inputProps: ComponentProps<"input">;
  className?: string;
}) {
  return (
    <ChoiceGroup {...group}>
      <div className="flex flex-wrap gap-x-6">
        {options.map((o) => (
          <label key={o.value} className="flex min-h-12 cursor-pointer items-center gap-3">
            <input type="radio" value={o.value} className="h-6 w-6 accent-brand" {...inputProps} />
            <span>{o.label}</span>
          </label>
        ))}
      </div>
    </ChoiceGroup>
  );
}

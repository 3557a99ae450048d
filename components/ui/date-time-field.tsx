"use client";
// A moment in the browser's own time, held by the form as an instant with its offset (ISO 8601);
// never later than now.
import type { ReactNode } from "react";
import { Controller, type Control, type FieldValues, type Path } from "react-hook-form";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { Field } from "./field";

export function DateTimeField<T extends FieldValues>({
  control,
  name,
  label,
  errors,
  testId,
}: {
  control: Control<T>;
  name: Path<T>;
  label: ReactNode;
  errors?: string[];
  testId?: string;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <Field
          label={label}
          type="datetime-local"
          max={toLocalInputValue(new Date().toISOString())}
          value={toLocalInputValue(field.value as string)}
          onChange={(e) => field.onChange(fromLocalInputValue(e.target.value))}
          onBlur={field.onBlur}
          name={field.name}
          ref={field.ref}
          errors={errors}
          data-testid={testId}
        />
      )}
    />
  );
}

"use client";
import { useState, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Notice } from "@/components/ui/notice";

type Variant = "primary" | "secondary" | "quiet";

/**
 * A button that does one thing on the server: asks first when `confirm` is given, is disabled
 * while it runs, says what went wrong in the one alert box, and shows what `onAction` returns
 * (a sentence) as a status.
 */
export function ActionButton({
  label,
  busyLabel,
  variant = "secondary",
  ariaLabel,
  confirm,
  failedText,
  failedTestId,
  onAction,
}: {
  label: ReactNode;
  busyLabel?: ReactNode;
  variant?: Variant;
  ariaLabel?: string;
  confirm?: string;
  failedText: string;
  failedTestId?: string;
  onAction: () => Promise<string | void>;
}) {
  const [busy, setBusy] = useState(false);
  const [failed, setFailed] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  return (
    <span className="inline-flex flex-col gap-1">
      <Button
        variant={variant}
        disabled={busy}
        aria-label={ariaLabel}
        onClick={async () => {
          if (confirm && !window.confirm(confirm)) return;
          setBusy(true);
          setFailed(false);
          setDone(null);
          try {
            setDone((await onAction()) || null);
          } catch {
            setFailed(true);
          } finally {
            setBusy(false);
          }
        }}
      >
        {busy && busyLabel ? busyLabel : label}
      </Button>
      {failed ? <ErrorAlert message={failedText} testId={failedTestId} /> : null}
      {done ? <Notice tone="ok" role="status" title={done} /> : null}
    </span>
  );
}

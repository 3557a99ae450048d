"use client";
// A small form without react-hook-form: the server validates, its field errors are kept as sent
// (path → codes) and worded by useErrorText; the rest goes to the one alert box.
import { useState } from "react";
import { useErrorText } from "@/components/ui/use-error-text";
import { isApiError } from "@/lib/browser/api-client";

export function usePlainForm() {
  const text = useErrorText("Transfer");
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return {
    busy,
    message,
    errors: (path: string) => fields[path]?.map((c) => text.one(c)),
    async run(action: () => Promise<void>) {
      setBusy(true);
      setMessage(null);
      setFields({});
      try {
        await action();
      } catch (error) {
        setFields(isApiError(error) ? error.fields : {});
        setMessage(text.ofError(error));
      } finally {
        setBusy(false);
      }
    },
  };
}

import { NextIntlClientProvider } from "next-intl";
import { getMessages } from "next-intl/server";
import type { ReactNode } from "react";
import { clientNamespaces, type ClientScope } from "@/lib/i18n/client-namespaces";
import { FormatRegion } from "./format";

/**
 * Gives the client components below it this scope's namespaces (and the root ones), not the
 * whole catalogue, and the deployment's region for dates and numbers (components/i18n/format) where
 * the layout reads it. It replaces an outer provider's messages, so it wraps its layout's whole output.
 */
export async function ClientMessages({ scope, region = null, children }: { scope: ClientScope; region?: string | null; children: ReactNode }) {
  const messages = await getMessages();
  const picked: Record<string, unknown> = {};
  for (const namespace of new Set<string>([...clientNamespaces.root, ...clientNamespaces[scope]])) {
    if (namespace in messages) picked[namespace] = messages[namespace as keyof typeof messages];
  }
  return (
    <NextIntlClientProvider messages={picked as typeof messages}>
      <FormatRegion region={region}>{children}</FormatRegion>
    </NextIntlClientProvider>
  );
}

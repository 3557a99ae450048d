import "server-only";
// Attachments are stored as descriptors ({ kind, filename, params }) and rendered when the
// message is sent, so the outbox stays small. Add a kind here to attach something new.
import type { AttachmentDescriptor } from "@/db/schema";

export type RenderedAttachment = { filename: string; content: Buffer; contentType: string };
type Renderer = (params: Record<string, string>) => Promise<{ content: Buffer; contentType: string }>;

const renderers: Record<string, () => Promise<Renderer>> = {
  "gp-summary-pdf": async () => (await import("./gp-summary")).renderGpSummaryAttachment,
};

export function isKnownAttachmentKind(kind: string) {
  return kind in renderers;
}

export async function renderAttachments(descriptors: readonly AttachmentDescriptor[]): Promise<RenderedAttachment[]> {
  const out: RenderedAttachment[] = [];
  for (const d of descriptors) {
    const load = renderers[d.kind];
    if (!load) throw new Error(`unknown attachment kind: ${d.kind}`);
    const render = await load();
    const { content, contentType } = await render(d.params);
    out.push({ filename: d.filename, content, contentType });
  }
  return out;
}

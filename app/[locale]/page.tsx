import { redirect } from "next/navigation";
import { getViewer, homePathFor } from "@/lib/auth/session";

export default async function LocaleIndex({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await getViewer();
  redirect(viewer ? `/${locale}${homePathFor(viewer.role)}` : `/${locale}/sign-in`);
}

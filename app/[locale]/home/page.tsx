import { redirect } from "next/navigation";
import { getViewer, homePathFor } from "@/lib/auth/session";

// Where sign-in lands: each role goes on to its own home.
export default async function Home({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await getViewer();
  redirect(viewer ? `/${locale}${homePathFor(viewer.role)}` : `/${locale}/sign-in`);
}

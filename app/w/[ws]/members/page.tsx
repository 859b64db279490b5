import type { Metadata } from "next";
import { MembersAdmin } from "@/components/workspace/MembersAdmin";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="mx-auto max-w-[100rem] px-4 py-6">
      <MembersAdmin ws={ws} />
    </main>
  );
}

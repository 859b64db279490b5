import type { Metadata } from "next";
import { FamilyEditor } from "@/components/workspace/FamilyEditor";

export const metadata: Metadata = { title: "Family" };

export default async function FamilyPage({ params }: { params: Promise<{ ws: string; familyId: string }> }) {
  const { ws, familyId } = await params;
  return (
    <main className="mx-auto max-w-[100rem] px-4 py-6">
      <FamilyEditor key={familyId} ws={ws} familyId={familyId} />
    </main>
  );
}

import type { Metadata } from "next";
import { FamilyList } from "@/components/workspace/FamilyList";

export const metadata: Metadata = { title: "Families" };

export default async function FamiliesPage({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="page-frame py-6">
      <FamilyList ws={ws} />
    </main>
  );
}

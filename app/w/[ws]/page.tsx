import type { Metadata } from "next";
import { DesignTable } from "@/components/workspace/DesignTable";
import { FamilyList } from "@/components/workspace/FamilyList";

export const metadata: Metadata = { title: "Designs" };

export default async function WorkspaceHome({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="page-frame grid gap-8 py-6 xl:grid-cols-[1fr_22rem]">
      <DesignTable ws={ws} />
      <aside>
        <FamilyList ws={ws} compact />
      </aside>
    </main>
  );
}

import type { Metadata } from "next";
import { DesignTable } from "@/components/workspace/DesignTable";
import { FamilyList } from "@/components/workspace/FamilyList";
import { ImportDrop } from "@/components/workspace/ImportDrop";

export const metadata: Metadata = { title: "Designs" };

export default async function WorkspaceHome({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="page-frame grid gap-8 py-6 xl:grid-cols-[1fr_22rem]">
      <ImportDrop ws={ws}>
        <DesignTable ws={ws} />
      </ImportDrop>
      <aside>
        <FamilyList ws={ws} compact />
      </aside>
    </main>
  );
}

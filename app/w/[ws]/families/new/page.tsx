import type { Metadata } from "next";
import { FamilyEditor } from "@/components/workspace/FamilyEditor";

export const metadata: Metadata = { title: "New family" };

export default async function NewFamilyPage({ params, searchParams }: { params: Promise<{ ws: string }>; searchParams: Promise<{ from?: string }> }) {
  const { ws } = await params;
  const { from } = await searchParams;
  return (
    <main className="mx-auto max-w-[100rem] px-4 py-6">
      <FamilyEditor ws={ws} from={from} />
    </main>
  );
}

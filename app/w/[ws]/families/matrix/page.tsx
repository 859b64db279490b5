import type { Metadata } from "next";
import { CompatibilityMatrix } from "@/components/workspace/CompatibilityMatrix";

export const metadata: Metadata = { title: "Compatibility" };

export default async function MatrixPage({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="mx-auto max-w-[100rem] px-4 py-6">
      <CompatibilityMatrix ws={ws} />
    </main>
  );
}

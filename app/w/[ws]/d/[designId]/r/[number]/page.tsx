import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { RevisionView } from "@/components/workbench/RevisionView";

export const metadata: Metadata = { title: "Revision" };

export default async function RevisionPage({ params }: { params: Promise<{ ws: string; designId: string; number: string }> }) {
  const { ws, designId, number } = await params;
  const n = Number(number);
  if (!Number.isInteger(n) || n < 1) notFound();
  return <RevisionView ws={ws} designId={designId} number={n} />;
}

import type { Metadata } from "next";
import { Workbench } from "@/components/workbench/Workbench";

export const metadata: Metadata = { title: "Workbench" };

export default async function DesignPage({ params }: { params: Promise<{ ws: string; designId: string }> }) {
  const { ws, designId } = await params;
  return <Workbench ws={ws} designId={designId} />;
}

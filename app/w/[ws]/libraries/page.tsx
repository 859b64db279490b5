import type { Metadata } from "next";
import { LibraryList } from "@/components/libraries/LibraryList";

export const metadata: Metadata = { title: "Libraries" };

export default async function LibrariesPage({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return (
    <main className="page-frame py-6">
      <LibraryList ws={ws} />
    </main>
  );
}

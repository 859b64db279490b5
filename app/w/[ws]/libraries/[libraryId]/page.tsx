import type { Metadata } from "next";
import { LibraryPage } from "@/components/libraries/LibraryPage";

export const metadata: Metadata = { title: "Library" };

export default async function LibraryRoute({ params }: { params: Promise<{ ws: string; libraryId: string }> }) {
  const { ws, libraryId } = await params;
  return (
    <main className="page-frame py-6">
      <LibraryPage ws={ws} libraryId={libraryId} />
    </main>
  );
}

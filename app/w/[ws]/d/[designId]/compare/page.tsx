import type { Metadata } from "next";
import { CompareView } from "@/components/review/CompareView";

export const metadata: Metadata = { title: "Compare" };

const revisionNumber = (v: string | undefined) => (v && /^\d{1,9}$/.test(v) && Number(v) > 0 ? Number(v) : undefined);

export default async function ComparePage({ params, searchParams }: {
  params: Promise<{ ws: string; designId: string }>;
  searchParams: Promise<{ from?: string; to?: string; review?: string }>;
}) {
  const { ws, designId } = await params;
  const q = await searchParams;
  const review = q.review && /^[0-9a-f-]{36}$/i.test(q.review) ? q.review : undefined;
  return (
    <CompareView ws={ws} designId={designId} from={revisionNumber(q.from)} to={q.to === "draft" ? "draft" : revisionNumber(q.to)} reviewId={review} />
  );
}

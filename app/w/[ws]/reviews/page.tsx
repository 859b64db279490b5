import type { Metadata } from "next";
import { ReviewsInbox } from "@/components/review/ReviewsInbox";

export const metadata: Metadata = { title: "Reviews" };

export default async function ReviewsPage({ params }: { params: Promise<{ ws: string }> }) {
  const { ws } = await params;
  return <ReviewsInbox ws={ws} />;
}

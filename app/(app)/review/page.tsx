import type { Metadata } from "next";
import { SheetListLive } from "@/components/sheets/sheet-list-live";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";

export const metadata: Metadata = { title: "Review queue" };

/** Leads: every sheet waiting for a check, except their own. */
export default async function ReviewPage() {
  await requirePageActor("sheet.review");
  return (
    <>
      <PageHeader title="Review queue" description="Sheets submitted for review, oldest first. Your own sheets are checked by another lead and do not appear here." />
      <SheetListLive url="/api/v1/review-queue" caption="Sheets waiting for review" emptyTitle="Nothing waiting for review" emptyText="Sheets appear here when an engineer submits them." />
    </>
  );
}

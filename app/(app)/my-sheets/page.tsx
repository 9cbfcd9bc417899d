import type { Metadata } from "next";
import { SheetListLive } from "@/components/sheets/sheet-list-live";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";

export const metadata: Metadata = { title: "My sheets" };

/** Engineers and leads: the sheets whose latest revision they wrote, recently changed first. */
export default async function MySheetsPage() {
  await requirePageActor("sheet.write");
  return (
    <>
      <PageHeader title="My sheets" description="Sheets whose latest revision you wrote: drafts, sheets in review, returned and approved ones." />
      <SheetListLive url="/api/v1/my-sheets" caption="My sheets" emptyTitle="No sheets yet" emptyText="Open a project and add a calculation sheet to it." />
    </>
  );
}

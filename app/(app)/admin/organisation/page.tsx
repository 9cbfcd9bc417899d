import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { DateTime } from "@/components/ui/date-time";
import { currentLogo, organisationBranding } from "@/db/queries/uploads";
import { requirePageActor } from "@/lib/auth/guard";
import { LogoForm } from "./logo-form";

export const metadata: Metadata = { title: "Organisation" };

export default async function OrganisationPage() {
  const actor = await requirePageActor("organisation.manage");
  const [branding, logo] = await Promise.all([organisationBranding(actor.organisationId), currentLogo(actor.organisationId)]);
  const preview = branding.logo ? `data:${branding.logo.contentType};base64,${branding.logo.data.toString("base64")}` : null;
  return (
    <div className="space-y-8">
      <PageHeader title={branding.name} description="The organisation's logo appears in the title block of every sheet PDF and calculation package." />
      <section aria-labelledby="logo-heading" className="panel p-5">
        <h2 id="logo-heading" className="mb-3 text-base font-semibold text-fen-900">
          Logo
        </h2>
        {logo && preview ? (
          <div className="mb-5 flex items-center gap-4">
            {/* eslint-disable-next-line @next/next/no-img-element -- an uploaded image shown as stored */}
            <img src={preview} alt={`Current logo of ${branding.name}`} className="h-12 max-w-48 rounded border border-fen-200 bg-white object-contain p-1" />
            <p className="text-sm text-fen-600">
              {logo.filename} · {(logo.sizeBytes / 1024).toFixed(0)} KB · uploaded <DateTime value={logo.createdAt} />
            </p>
          </div>
        ) : (
          <p className="mb-5 text-sm text-fen-500">No logo yet: PDFs print the organisation&apos;s name alone.</p>
        )}
        <LogoForm />
      </section>
    </div>
  );
}

import "server-only";
import { lookupVerification, type Verification } from "@/db/queries/verification";
import { isoDate } from "@/lib/pdf/styles";

/**
 * What the public verification page says about a stamp's code: a headline state and a
 * few lines naming only the organisation, the sheet tag and revision labels.
 */
export interface VerificationView {
  state: Verification["state"];
  headline: string;
  lines: string[];
}

export async function verificationView(code: string): Promise<VerificationView> {
  const v = await lookupVerification(code);
  if (v.state === "unknown") {
    return {
      state: "unknown",
      headline: "Unknown code",
      lines: ["No approved revision carries this code. Check the code on the stamp; a sheet printed without a stamp was never approved."],
    };
  }
  const who = `${v.organisationName} · sheet ${v.sheetTag} · revision ${v.label}`;
  const approved = `Approved on ${isoDate(v.approvedAt ?? null)}.`;
  if (v.state === "approved-current") {
    return { state: v.state, headline: "Approved and current", lines: [who, approved, "This is the revision in force."] };
  }
  const by = v.supersededBy ? `Superseded by revision ${v.supersededBy.label}, approved on ${isoDate(v.supersededBy.approvedAt)}.` : "Superseded by a later revision.";
  return { state: v.state, headline: "Superseded", lines: [who, approved, by, "Ask the issuer for the current revision."] };
}

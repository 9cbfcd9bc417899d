import { DateTime } from "@/components/ui/date-time";
import { listProjectPackages } from "@/db/queries/uploads";
import { IssuePackageForm } from "./issue-package-form";

/**
 * The project's calculation packages: the form that issues one (every approved sheet,
 * optionally with drafts watermarked) and the packages issued so far, each downloadable
 * exactly as issued.
 */
export async function PackagePanel({ projectId, organisationId, canIssue }: { projectId: number; organisationId: number; canIssue: boolean }) {
  const packages = await listProjectPackages(organisationId, projectId);
  const base = `/api/v1/projects/${projectId}/package`;
  return (
    <section id="packages" aria-labelledby="packages-heading" className="panel mb-6 p-5">
      <h2 id="packages-heading" className="mb-3 text-sm font-semibold uppercase tracking-wider text-fen-600">
        Calculation package
      </h2>
      {canIssue ? <IssuePackageForm action={base} /> : null}
      {packages.length === 0 ? (
        <p className="mt-3 text-sm text-fen-500">No package issued yet.</p>
      ) : (
        <table className="data-table mt-4">
          <caption className="sr-only">Issued calculation packages</caption>
          <thead>
            <tr>
              <th>Package</th>
              <th>Issued</th>
              <th>By</th>
              <th className="text-right">Sheets</th>
              <th>SHA-256</th>
              <th>
                <span className="sr-only">Download</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {packages.map((p) => (
              <tr key={p.uploadId}>
                <td className="font-mono font-semibold">
                  {p.label}
                  {p.includesDrafts ? <span className="badge ml-2">with drafts</span> : null}
                </td>
                <td>
                  <DateTime value={p.issuedAt} />
                </td>
                <td>{p.issuedByName ?? "—"}</td>
                <td className="text-right tabular-nums">{p.sheetCount}</td>
                <td className="font-mono text-xs text-fen-500" title={p.sha256}>
                  {p.sha256.slice(0, 12)}…
                </td>
                <td>
                  <a href={`${base}?upload=${p.uploadId}`} className="text-copper-700 hover:underline" download={p.filename}>
                    Download PDF
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

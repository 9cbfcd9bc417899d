import { indexMarks, packageDocument, type PackageInfo } from "./package-pages";
import { pageRefText } from "./render-core.mjs";
import { renderInWorker } from "./worker-render";

/**
 * Renders a package in the worker thread. One rendering normally suffices: the index
 * refers to the marks live. It is accepted only when every index entry printed exactly
 * the page its part starts on; otherwise the package is rendered once more with those
 * page numbers written in (the same geometry, so the parts stay where they were).
 */
export async function renderPackage(info: PackageInfo, root?: string): Promise<{ pdf: Buffer; pages: Record<string, number>; passes: number }> {
  const first = await renderInWorker(packageDocument(info, null), root);
  if (indexMarks(info).every((m) => first.marks[m] !== undefined && first.refs[m] === pageRefText(first.marks[m]))) {
    return { pdf: first.pdf, pages: first.marks, passes: 1 };
  }
  const second = await renderInWorker(packageDocument(info, first.marks), root);
  return { pdf: second.pdf, pages: second.marks, passes: 2 };
}

/**
 * The downloadable CSV template: the header Ohmstead reads, with notes as comment lines.
 * It holds no rows: the values must come from the code the organisation works to.
 */
export const AMPACITY_TEMPLATE_FILENAME = "ohmstead-ampacity-table-template.csv";

export const AMPACITY_TEMPLATE_CSV = [
  "# Ohmstead ampacity table template. Lines starting with # are ignored.",
  "# Columns (any order, found by their header): size with its unit (mm2, kcmil, AWG or AWG/kcmil),",
  "#   label (optional), material (copper or aluminium), insulation (pvc, xlpe, epr, rubber-60, thhn, thwn, xhhw, other),",
  "#   installation method (your code's method, e.g. E, F, C, tray), reference ambient with its unit (C or F),",
  "#   conductor maximum temperature with its unit (optional; default from the insulation; required for 'other'), amps.",
  "# Separator: comma or semicolon. With semicolons a decimal comma (1,5) is read; with commas, quote it (\"1,5\").",
  "# One row per size, material, insulation and installation method; every row must be valid or the table is refused.",
  "# Add one line per row of the code's table under the header, for example (amps from your code):",
  "#   2.5,2.5 mm²,copper,pvc,E,30,70,<amps>",
  "#   4/0 in a size (AWG/kcmil) column, 250 for 250 kcmil",
  "size (mm2),label,material,insulation,installation method,reference ambient (C),conductor max (C),amps",
  "",
].join("\r\n");

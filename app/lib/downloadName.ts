/** The stem of a download's file name from a network's name: letters, digits and hyphens, never empty. */
export function downloadFileStem(name: string): string {
  const stem = name
    .normalize("NFKD")
    .replace(/[^\w\s-]/g, "")
    .trim()
    .replace(/[\s_]+/g, "-")
    .slice(0, 80)
    .toLowerCase();
  return stem || "network";
}

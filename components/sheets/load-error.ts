// Plain-language reasons for a sheet that cannot be shown. pdf.js errors carry a `name`.

export function describeLoadError(error: unknown): string {
  const e = error as { name?: unknown; status?: unknown } | null;
  const name = typeof e?.name === "string" ? e.name : "";
  if (name === "PasswordException") return "This PDF is password-protected and cannot be shown.";
  if (name === "InvalidPDFException") return "This file is not a readable PDF.";
  if (name === "ResponseException") {
    const status = typeof e?.status === "number" ? e.status : 0;
    if (status === 401 || status === 403) return "Your session has ended or this drawing is not yours to view. Sign in again and reload.";
    if (status === 404) return "This drawing could not be found. It may have been withdrawn.";
    return status > 0 ? `The drawing could not be fetched (HTTP ${status}).` : "The drawing could not be fetched. Check the connection and reload.";
  }
  if (name === "MissingPDFException") return "This drawing could not be found. It may have been withdrawn.";
  return "This sheet could not be drawn.";
}

/** pdf.js rejects a cancelled render with this name; it is not a failure. */
export function isRenderCancelled(error: unknown): boolean {
  return (error as { name?: unknown } | null)?.name === "RenderingCancelledException";
}

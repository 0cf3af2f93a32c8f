/**
 * One byte range of an HTTP Range header (RFC 9110 §14.1.2): "bytes=a-b", "bytes=a-" or the
 * suffix form "bytes=-n". Anything else (several ranges, other units) → null: send the whole file.
 */
export function parseRange(header: string | null, size: number): { start: number; end: number } | "unsatisfiable" | null {
  const m = header?.trim().match(/^bytes=(\d*)-(\d*)$/);
  if (!m || (m[1] === "" && m[2] === "")) return null;
  let start: number;
  let end: number;
  if (m[1] === "") {
    if (Number(m[2]) === 0) return "unsatisfiable";
    start = Math.max(0, size - Number(m[2]));
    end = size - 1;
  } else {
    start = Number(m[1]);
    end = m[2] === "" ? size - 1 : Math.min(Number(m[2]), size - 1);
    if (m[2] !== "" && Number(m[2]) < start) return null; // invalid range-spec: ignore the header
  }
  if (start >= size) return "unsatisfiable";
  return { start, end };
}

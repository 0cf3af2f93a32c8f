import { flexRender, type Header } from "@tanstack/react-table";

/**
 * A column header that sorts when it can: the one header every Spanproof table uses, whether the
 * sorting happens in the browser or on the server. `direction` is the current order of this column.
 */
export function SortableTh<T>({ header, direction, onSort }: { header: Header<T, unknown>; direction: "asc" | "desc" | false | null; onSort?: (event: unknown) => void }) {
  const label = flexRender(header.column.columnDef.header, header.getContext());
  return (
    <th scope="col" aria-sort={direction === "asc" ? "ascending" : direction === "desc" ? "descending" : undefined} className="px-3 py-2 font-medium text-ink-soft">
      {onSort ? (
        <button type="button" onClick={onSort} className="inline-flex items-center gap-1 hover:text-ink">
          {label}
          <span aria-hidden="true" className="text-xs">
            {direction === "asc" ? "▲" : direction === "desc" ? "▼" : "↕"}
          </span>
        </button>
      ) : (
        label
      )}
    </th>
  );
}

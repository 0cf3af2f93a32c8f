import type { View } from "./types";

export function Timeline({ events, exportUrl }: { events: View["timeline"]; exportUrl?: string }) {
  return (
    <section aria-labelledby="timeline-title" className="mt-8">
      <div className="mb-3 flex items-baseline justify-between">
        <h2 id="timeline-title" className="text-lg font-semibold">History</h2>
        {exportUrl ? (
          <a href={exportUrl} className="text-sm text-accent underline-offset-2 hover:underline">
            Export audit trail (CSV)
          </a>
        ) : null}
      </div>
      <ol className="border-l border-rule-strong pl-4 text-sm">
        {events.map((e) => (
          <li key={e.id} className="relative mb-2">
            <span aria-hidden="true" className="absolute -left-[1.33rem] top-1.5 h-2 w-2 rounded-full border border-ink-soft bg-sheet" />
            <span className="num mr-2 text-xs text-ink-faint">{new Date(e.at).toLocaleString("en-US", { dateStyle: "medium", timeStyle: "short" })}</span>
            {e.summary}
            {e.actorName ? <span className="text-ink-soft"> — {e.actorName}</span> : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

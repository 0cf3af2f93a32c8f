"use client";

import { useQuery } from "@tanstack/react-query";
import { FormMessage } from "@/components/ui/field";
import { fetchJson } from "@/lib/client/fetch-json";

interface Mail {
  seq: number;
  messageId: string;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

export function Mailbox() {
  const q = useQuery({
    queryKey: ["mailbox"],
    queryFn: () => fetchJson<{ messages: Mail[] }>("/api/mailbox").then((r) => r.messages),
    refetchInterval: 5000,
  });
  if (q.isError) return <FormMessage kind="error">{q.error.message}</FormMessage>;
  if (q.isPending) return <p className="text-sm text-ink-soft">Loading…</p>;
  if (q.data.length === 0) return <p className="text-sm text-ink-soft">No messages captured yet.</p>;
  return (
    <ol className="space-y-3">
      {q.data.map((m) => (
        <li key={m.seq} className="border border-rule bg-sheet">
          <details>
            <summary className="cursor-pointer px-4 py-2 text-sm">
              <span className="font-medium">{m.subject}</span>
              <span className="ml-3 text-ink-soft">to {m.to.join(", ")}</span>
              <span className="num ml-3 text-xs text-ink-faint">{new Date(m.receivedAt).toLocaleString("en-US")}</span>
            </summary>
            <pre className="whitespace-pre-wrap border-t border-rule px-4 py-3 font-sans text-sm">{m.text}</pre>
          </details>
        </li>
      ))}
    </ol>
  );
}

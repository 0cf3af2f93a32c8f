"use client";

import { useMutation } from "@tanstack/react-query";
import { fetchJson } from "@/lib/client/fetch-json";

/** "Pay online": ask the server for the provider's checkout page, then go there. */
export function usePayOnline() {
  return useMutation({
    mutationFn: async (invoiceId: number) => {
      const { url } = await fetchJson<{ url: string }>(`/api/invoices/${invoiceId}/checkout`, { method: "POST" });
      window.location.assign(url);
      // Stay busy while the browser leaves the page.
      await new Promise(() => {});
    },
  });
}

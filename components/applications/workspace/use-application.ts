"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/lib/client/fetch-json";
import type { View } from "./types";

export const appKey = (id: number) => ["application", id] as const;

export function useApplication(id: number, initial: View) {
  return useQuery({
    queryKey: appKey(id),
    queryFn: () => fetchJson<View>(`/api/applications/${id}`),
    initialData: initial,
    // Live status: someone else may act on the same file.
    refetchInterval: 20_000,
  });
}

/** A mutation that refreshes the application afterwards, whatever the outcome. */
export function useAppMutation<V>(id: number, fn: (v: V) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => qc.invalidateQueries({ queryKey: appKey(id) }),
  });
}

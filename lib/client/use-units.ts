"use client";

import { useCallback } from "react";
import useSWR from "swr";
import type { UnitSystem } from "@/lib/units";
import { fetchJson, sendJson } from "./fetcher";

interface MeDto {
  user: { id: string; name: string; email: string; unitSystem: UnitSystem };
}

const ME = "/api/v1/me";
// Its own cache key: other screens keep the whole /me answer under ME.
const KEY = `${ME}#unitSystem`;

async function readUnits(): Promise<UnitSystem> {
  return (await fetchJson<MeDto>(ME)).user.unitSystem;
}

/**
 * The signed-in person's unit system, starting from the server's value so the page renders in the right
 * units at once; `setUnits` saves it (PATCH /me) and every screen using the hook follows.
 */
export function useUnits(initial: UnitSystem) {
  const { data, mutate, error } = useSWR<UnitSystem>(KEY, readUnits, { fallbackData: initial, revalidateOnMount: false, revalidateOnFocus: false });
  const setUnits = useCallback(
    async (next: UnitSystem) => {
      await mutate(async () => (await sendJson<MeDto>(ME, "PATCH", { unitSystem: next })).user.unitSystem, {
        optimisticData: next,
        rollbackOnError: true,
        revalidate: false,
      });
    },
    [mutate],
  );
  return { units: data ?? initial, setUnits, error: error as Error | undefined };
}

"use client";

import { useState, type FormEvent } from "react";
import { ApiError } from "@/lib/client/fetcher";

/**
 * Submit state for a small form that posts to the API: busy flag, a message, and the per-field
 * messages the API returned, so every error is shown where it belongs.
 */
export function useFormSubmit<T>(send: (form: FormData) => Promise<T>, onDone: (result: T) => void) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setFields({});
    try {
      onDone(await send(new FormData(e.currentTarget)));
    } catch (err) {
      if (err instanceof ApiError) {
        setError(err.message);
        setFields(err.fields);
      } else {
        setError("Rootbank could not be reached. Check the connection and try again.");
      }
    } finally {
      setBusy(false);
    }
  }

  return { busy, error, fields, onSubmit };
}

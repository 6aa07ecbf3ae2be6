/** The caution beside anything that changes how the account recommends water. */
export function TuningCaution() {
  return (
    <p className="rounded-xl bg-clay-50 px-4 py-3 text-sm text-clay-900 ring-1 ring-clay-300">
      <span className="font-bold">These figures are estimates.</span> A tuned curve changes every
      recommendation for this field. Check the result against the field (probe, auger or feel), follow your
      local water rules and licence conditions, and take licensed agronomic advice where it matters.
    </p>
  );
}

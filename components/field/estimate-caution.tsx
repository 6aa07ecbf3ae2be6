/** The caution every irrigation recommendation carries. */
export function EstimateCaution() {
  return (
    <p className="rounded-xl bg-clay-50 px-4 py-3 text-sm text-clay-900 ring-1 ring-clay-300">
      <span className="font-bold">An estimate, not an instruction.</span> It comes from the water account and the weather outlook. Confirm
      with a field check (probe or feel) before you irrigate, and follow your local water rules and licensed advice.
    </p>
  );
}

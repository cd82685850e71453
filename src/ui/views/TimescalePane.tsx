/** Placeholder until the timescale views land: the ordering at the chosen sampling interval. */
export function TimescalePane() {
  return <section aria-label="Ordering at the sampling interval"><p>The view at a sampling interval is being built.</p></section>;
}

/** The caution shown next to every safety figure (the command line prints the same words). */
export const SAFETY_CAUTION =
  "Mains circuits and their outputs can kill, and capacitors can stay charged after unplugging; ozone and high voltage are hazards too. " +
  "Every figure here is an estimate computed from a traced netlist, not a measurement or a compliance verdict. Local codes and licensed practice decide.";

export function SafetyCaution() {
  return (
    <aside className="caution" role="note" aria-label="Safety caution">
      <strong>Caution.</strong> {SAFETY_CAUTION}
    </aside>
  );
}

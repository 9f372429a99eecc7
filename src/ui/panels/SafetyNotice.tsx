/** The caution every export carries; shown on the page from the start. */
export function SafetyNotice() {
  return (
    <p className="safety-notice" role="note" aria-label="Safety caution">
      <strong>Caution:</strong> transmit generated or exported waveforms only under a licence and within local regulations. Test
      conducted — through attenuators or in a shielded enclosure — and keep every signal within your instrument’s input limits.
      Where in doubt, local codes and licensed practice take precedence.
    </p>
  );
}

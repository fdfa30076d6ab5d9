/** A chemical formula with its counts as subscripts: "Nb0.2Mo0.8" → Nb₀.₂Mo₀.₈ (display only; the text stays copyable). */
export function Formula({ text }: { text: string }) {
  const parts = text.split(/(\d+(?:\.\d+)?)/);
  return (
    <span className="formula">
      {parts.map((part, i) => (i % 2 === 1 ? <sub key={i}>{part}</sub> : <span key={i}>{part}</span>))}
    </span>
  );
}

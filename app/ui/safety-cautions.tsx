/**
 * The usual cautions for high-voltage RF equipment, shown where people are about to run, lend or
 * repair a coil. Coilyard records checks; it never says a build is safe.
 */
export function SafetyCautions({ context = "run" }: { context?: "run" | "lend" | "repair" }) {
  return (
    <aside className="notice warn caution" aria-label="Safety cautions">
      <strong>Before you {context === "lend" ? "lend this coil" : context === "repair" ? "open this coil up" : "run this coil"}:</strong>
      <ul>
        <li>The DC supply is the most direct lethal hazard — switch it off and isolate it before touching anything{context === "repair" ? ", and discharge the bus capacitors" : ""}.</li>
        <li>RF burns: above about 100 kHz the output and its arcs burn at the point of contact, often without a felt shock.</li>
        <li>Keep a clear zone, one operator and a grounded discharge wand; keep people with implanted medical devices away.</li>
        <li>Arcs make ozone and nitrogen oxides and can start fires: ventilate and keep flammables clear.</li>
        <li>Never put the output on vacuum tubes, bulbs or other evacuated glass (X-rays).</li>
      </ul>
      <p style={{ margin: "0.4rem 0 0" }}>
        Follow your local codes, the venue&apos;s rules and licensed practice. Passing Coilyard&apos;s checks means a build met the team&apos;s
        recorded criteria, not that it is safe.
      </p>
    </aside>
  );
}

// The model file's inputs as written (strings with their units), for the report and the saved check.

type Loose = Record<string, unknown>;

const th = "border-b border-ink px-1.5 py-0.5 text-left text-xs font-semibold";
const td = "border-b border-rule px-1.5 py-0.5 align-top";
const tdNum = `${td} num whitespace-nowrap`;

const text = (v: unknown): string => (v === undefined ? "—" : Array.isArray(v) ? v.map(text).join(" → ") : typeof v === "object" && v !== null ? JSON.stringify(v) : String(v));

function describeLoad(l: Loose): string {
  const on = typeof l.member === "string" ? `member ${l.member}` : `node ${text(l.node)}`;
  const parts: string[] = [];
  if (l.w !== undefined) parts.push(`w = ${text(l.w)}${l.from !== undefined || l.to !== undefined ? ` from ${text(l.from ?? "start")} to ${text(l.to ?? "end")}` : ""}${l.per === "horizontal" ? " per horizontal projection" : ""}`);
  if (l.P !== undefined) parts.push(`P = ${text(l.P)} at ${text(l.at)}`);
  if (l.M !== undefined) parts.push(`M = ${text(l.M)}${l.at !== undefined ? ` at ${text(l.at)}` : ""}`);
  if (l.Fx !== undefined) parts.push(`Fx = ${text(l.Fx)}`);
  if (l.Fy !== undefined) parts.push(`Fy = ${text(l.Fy)}`);
  if (l.dT !== undefined) parts.push(`ΔT = ${text(l.dT)}, α = ${text(l.alpha)}`);
  if (l.misfit !== undefined) parts.push(`too long by ${text(l.misfit)}`);
  if (l.settle !== undefined) parts.push(`settlement ${text(l.settle)}`);
  if (l.dir === "local") parts.push("(member's local y)");
  return `${on}: ${parts.join(", ")}`;
}

export function ModelInputs({ model }: { model: unknown }) {
  const m = (model ?? {}) as Loose;
  const nodes = Object.entries((m.nodes ?? {}) as Record<string, unknown[]>);
  const members = Object.entries((m.members ?? {}) as Record<string, Loose>);
  const supports = Object.entries((m.supports ?? {}) as Record<string, unknown>);
  const loads = (Array.isArray(m.loads) ? m.loads : []) as Loose[];
  const checks = (Array.isArray(m.checks) ? m.checks : []) as Loose[];
  return (
    <div className="grid gap-4 text-sm md:grid-cols-2 print:grid-cols-2">
      <table className="w-full border-collapse">
        <caption className="mb-1 text-left text-xs font-semibold uppercase text-ink-soft">Nodes and supports ({text(m.kind)})</caption>
        <thead>
          <tr>
            <th className={th}>Node</th>
            <th className={th}>x</th>
            <th className={th}>y</th>
            <th className={th}>Support</th>
          </tr>
        </thead>
        <tbody>
          {nodes.map(([id, xy]) => (
            <tr key={id}>
              <td className={td}>{id}</td>
              <td className={tdNum}>{text(xy?.[0])}</td>
              <td className={tdNum}>{text(xy?.[1])}</td>
              <td className={td}>{text(supports.find(([n]) => n === id)?.[1] ?? "")}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="w-full border-collapse">
        <caption className="mb-1 text-left text-xs font-semibold uppercase text-ink-soft">Members</caption>
        <thead>
          <tr>
            <th className={th}>Member</th>
            <th className={th}>Ends</th>
            <th className={th}>E</th>
            <th className={th}>I</th>
            <th className={th}>A</th>
          </tr>
        </thead>
        <tbody>
          {members.map(([id, mm]) => (
            <tr key={id}>
              <td className={td}>
                {id}
                {mm.note ? <div className="text-xs text-ink-soft">{text(mm.note)}</div> : null}
              </td>
              <td className={td}>{text(mm.ends)}</td>
              <td className={tdNum}>{text(mm.E)}</td>
              <td className={tdNum}>{text(mm.I)}</td>
              <td className={tdNum}>
                {text(mm.A)}
                {mm.shear ? <div className="text-xs">shear: G {text((mm.shear as Loose).G)}, Av {text((mm.shear as Loose).Av)}</div> : null}
                {mm.release ? <div className="text-xs">hinge: {text(mm.release)}</div> : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div>
        <p className="mb-1 text-xs font-semibold uppercase text-ink-soft">Loads</p>
        <ol className="ml-5 list-decimal">
          {loads.map((l, i) => (
            <li key={i} className="num">
              <span className="font-medium">{text(l.case ?? "D")}</span> {describeLoad(l)}
              {l.note ? <span className="text-xs text-ink-soft"> — {text(l.note)}</span> : null}
            </li>
          ))}
        </ol>
      </div>
      <div>
        <p className="mb-1 text-xs font-semibold uppercase text-ink-soft">Checks and claims</p>
        <ul className="ml-5 list-disc">
          {checks.map((c, i) => (
            <li key={i}>
              {text(c.id ?? c.member ?? c.members)}: row {text(c.row)}, material {text(c.material ?? "other")}
              {c.cantilever ? ", cantilever" : ""}
              {c.span ? `, span ${text(c.span)}` : ""}
              {Array.isArray(c.claimed) && c.claimed.length ? `; claimed ${(c.claimed as Loose[]).map((k) => `${text(k.combo)} ${text(k.delta)}`).join(", ")}` : ""}
            </li>
          ))}
        </ul>
      </div>
    </div>
  );
}

import type { ReactNode } from "react";
import type { Geometry, DrawMember, DrawNode, DrawSupport, DrawLoad } from "@/lib/checks/geometry";
import { bothForces, bothLengths, bothMoments, fmt } from "@/lib/checks/quantities";
import type { MemberResult, SolveResult } from "@/lib/solver";

// Drafting-style drawings of a structure and its results, as plain SVG (no hooks), so the
// same components draw on the check page and on the printable report. World coordinates are
// metres with y up; the SVG's y runs down.

const INK = "#24272a";
const SOFT = "#8a8d91";
const ACCENT = "#14665d";
const BAD = "#a1321f";
const FONT = 10;
// A white halo behind labels keeps them readable over arrows and hatching.
const HALO = { paintOrder: "stroke", stroke: "white", strokeWidth: 3, strokeLinejoin: "round" } as const;

interface Frame {
  width: number;
  height: number;
  sx: (x: number) => number;
  sy: (y: number) => number;
  /** px per m */
  k: number;
}

function frameFor(g: Geometry, width: number, opts: { minHeight: number; maxHeight: number; pad: number; baseline?: number }): Frame {
  const { minX, maxX, minY, maxY } = g.box;
  const dx = Math.max(maxX - minX, 1e-6);
  const dy = maxY - minY;
  const pad = opts.pad;
  const kx = (width - 2 * pad) / dx;
  const ky = dy > 1e-9 ? (opts.maxHeight - 2 * pad) / dy : Number.POSITIVE_INFINITY;
  const k = Math.min(kx, ky);
  const height = Math.max(opts.minHeight, Math.min(opts.maxHeight, dy * k + 2 * pad));
  const ox = (width - dx * k) / 2;
  const oy = (height - dy * k) / 2;
  // a beam sits on a baseline above its supports and dimension line, its loads stacked above it
  const base = opts.baseline !== undefined && dy <= 1e-9 ? height - opts.baseline : height - oy;
  return { width, height, k, sx: (x) => ox + (x - minX) * k, sy: (y) => base - (y - minY) * k };
}

const unit = (m: DrawMember) => {
  const c = (m.b.x - m.a.x) / m.length;
  const s = (m.b.y - m.a.y) / m.length;
  return { c, s };
};

/** Screen point of a spot at distance x along a member, offset by (local y) off metres or px. */
function along(f: Frame, m: DrawMember, x: number, offsetPx = 0): [number, number] {
  const { c, s } = unit(m);
  const wx = m.a.x + c * x;
  const wy = m.a.y + s * x;
  // local y = axis turned 90° counter-clockwise: (−s, c); on screen y flips
  return [f.sx(wx) - s * offsetPx, f.sy(wy) - c * offsetPx];
}

function Hatch({ x1, y1, x2, y2, nx, ny }: { x1: number; y1: number; x2: number; y2: number; nx: number; ny: number }) {
  const lines: ReactNode[] = [];
  const n = 5;
  for (let i = 0; i <= n; i++) {
    const t = i / n;
    const px = x1 + (x2 - x1) * t;
    const py = y1 + (y2 - y1) * t;
    lines.push(<line key={i} x1={px} y1={py} x2={px + nx * 5 - (ny === 0 ? 0 : 3)} y2={py + ny * 5 + (nx === 0 ? 0 : 3)} stroke={INK} strokeWidth={0.7} />);
  }
  return <g>{lines}</g>;
}

/** Supports as drawn on framing plans: pin triangle, roller on wheels, fixed wall with hatching. */
function SupportSymbol({ f, s, g }: { f: Frame; s: DrawSupport; g: Geometry }) {
  const x = f.sx(s.node.x);
  const y = f.sy(s.node.y);
  const size = 11;
  const label = `${s.kind === "custom" ? s.dofs.join(", ") : s.kind} support at ${s.node.id}`;
  if (s.kind === "fixed") {
    // The wall stands across the member(s) meeting the node, hatched on the far side.
    const attached = g.members.filter((m) => m.a === s.node || m.b === s.node);
    let ax = 0;
    let ay = 0;
    for (const m of attached) {
      const other = m.a === s.node ? m.b : m.a;
      ax += other.x - s.node.x;
      ay += other.y - s.node.y;
    }
    const len = Math.hypot(ax, ay) || 1;
    const ux = ax / len;
    const uy = -ay / len;
    const px = -uy;
    const py = ux;
    return (
      <g aria-label={label}>
        <title>{label}</title>
        <line x1={x + px * size} y1={y + py * size} x2={x - px * size} y2={y - py * size} stroke={INK} strokeWidth={2.2} />
        <Hatch x1={x + px * size} y1={y + py * size} x2={x - px * size} y2={y - py * size} nx={-ux} ny={-uy} />
      </g>
    );
  }
  if (s.kind === "roller-x") {
    return (
      <g aria-label={label}>
        <title>{label}</title>
        <polygon points={`${x},${y} ${x - size},${y - size * 0.6} ${x - size},${y + size * 0.6}`} fill="white" stroke={INK} strokeWidth={1} />
        <circle cx={x - size - 3} cy={y - 4} r={2.6} fill="white" stroke={INK} strokeWidth={0.9} />
        <circle cx={x - size - 3} cy={y + 4} r={2.6} fill="white" stroke={INK} strokeWidth={0.9} />
        <line x1={x - size - 6} y1={y - size} x2={x - size - 6} y2={y + size} stroke={INK} strokeWidth={1} />
      </g>
    );
  }
  if (s.kind === "custom") {
    return (
      <g aria-label={label}>
        <title>{label}</title>
        <rect x={x - 6} y={y + 2} width={12} height={10} fill="white" stroke={INK} />
        <text {...HALO} x={x} y={y + 24} fontSize={8} textAnchor="middle" fill={INK}>
          {s.dofs.join(" ")}
        </text>
      </g>
    );
  }
  const roller = s.kind === "roller";
  const base = y + size + (roller ? 6 : 0);
  return (
    <g aria-label={label}>
      <title>{label}</title>
      <polygon points={`${x},${y} ${x - size * 0.8},${y + size} ${x + size * 0.8},${y + size}`} fill="white" stroke={INK} strokeWidth={1} />
      {roller ? (
        <>
          <circle cx={x - 4} cy={y + size + 3} r={2.6} fill="white" stroke={INK} strokeWidth={0.9} />
          <circle cx={x + 4} cy={y + size + 3} r={2.6} fill="white" stroke={INK} strokeWidth={0.9} />
        </>
      ) : null}
      <line x1={x - size} y1={base} x2={x + size} y2={base} stroke={INK} strokeWidth={1} />
      <Hatch x1={x - size} y1={base} x2={x + size} y2={base} nx={0} ny={1} />
    </g>
  );
}

function Arrow({ x1, y1, x2, y2, color = INK }: { x1: number; y1: number; x2: number; y2: number; color?: string }) {
  const a = Math.atan2(y2 - y1, x2 - x1);
  const h = 5;
  const p1 = [x2 - h * Math.cos(a - 0.45), y2 - h * Math.sin(a - 0.45)];
  const p2 = [x2 - h * Math.cos(a + 0.45), y2 - h * Math.sin(a + 0.45)];
  return (
    <g>
      <line x1={x1} y1={y1} x2={x2} y2={y2} stroke={color} strokeWidth={1} />
      <polygon points={`${x2},${y2} ${p1[0]},${p1[1]} ${p2[0]},${p2[1]}`} fill={color} />
    </g>
  );
}

function loadLabel(l: DrawLoad, us: boolean): string {
  if (l.type === "node") return `${l.case} ${bothForces(Math.hypot(l.fx, l.fy), us ? "kip" : "kN").split(" (")[0]}`;
  if (l.type === "point") return `${l.case} ${bothForces(Math.abs(l.p), us ? "kip" : "kN").split(" (")[0]}`;
  const w = Math.max(Math.abs(l.wa), Math.abs(l.wb));
  return `${l.case} ${us ? `${fmt(w / 14.5939029)} plf` : `${fmt(w / 1000)} kN/m`}`;
}

const LOAD_BAND = 26;

function LoadGlyph({ f, l, us, stack }: { f: Frame; l: Exclude<DrawLoad, { type: "node" }>; us: boolean; stack: number }) {
  const len = 26;
  const { c, s } = unit(l.member);
  // direction of the load on screen: global y (down negative) or the member's local y
  const dirWorld = l.local ? { x: -s, y: c } : { x: 0, y: 1 };
  const sign = (l.type === "point" ? l.p : l.wa + l.wb) < 0 ? -1 : 1;
  const dx = dirWorld.x * sign;
  const dy = -dirWorld.y * sign;
  if (l.type === "point") {
    const [x, y] = along(f, l.member, l.at);
    return (
      <g>
        <Arrow x1={x - dx * (len + 12 * stack)} y1={y - dy * (len + 12 * stack)} x2={x - dx * 2} y2={y - dy * 2} color={ACCENT} />
        <text {...HALO} x={x + 4} y={y - dy * (len + 12 * stack) + 8} fontSize={FONT - 1} fill={ACCENT}>
          {loadLabel(l, us)}
        </text>
      </g>
    );
  }
  // one band per load on the member, each band's arrows 8–18 px long, bands 26 px apart
  const offset = 4 + LOAD_BAND * stack;
  const n = Math.max(2, Math.round(((l.b - l.a) * f.k) / 18));
  const wmax = Math.max(Math.abs(l.wa), Math.abs(l.wb)) || 1;
  const arrows: ReactNode[] = [];
  const top: string[] = [];
  for (let i = 0; i <= n; i++) {
    const x = l.a + ((l.b - l.a) * i) / n;
    const w = Math.abs(l.wa + ((l.wb - l.wa) * i) / n);
    const [px, py] = along(f, l.member, x);
    const h = 8 + (10 * w) / wmax;
    const sx = px - dx * (offset + h);
    const sy = py - dy * (offset + h);
    top.push(`${sx},${sy}`);
    arrows.push(<Arrow key={i} x1={sx} y1={sy} x2={px - dx * offset} y2={py - dy * offset} color={ACCENT} />);
  }
  const [lx, ly] = along(f, l.member, l.a);
  return (
    <g>
      <polyline points={top.join(" ")} fill="none" stroke={ACCENT} strokeWidth={1} />
      {arrows}
      <text {...HALO} x={lx + 3} y={ly - dy * (offset + 21)} fontSize={FONT - 1} fill={ACCENT}>
        {loadLabel(l, us)}
      </text>
    </g>
  );
}

/** Node loads at one node in one direction: one arrow, one line of label per case. */
function NodeLoads({ f, loads, us }: { f: Frame; loads: Extract<DrawLoad, { type: "node" }>[]; us: boolean }) {
  const groups = new Map<string, { node: DrawNode; ux: number; uy: number; labels: string[] }>();
  for (const l of loads) {
    const mag = Math.hypot(l.fx, l.fy) || 1;
    const ux = l.fx / mag;
    const uy = -l.fy / mag;
    const key = `${l.node.id}|${ux.toFixed(2)}|${uy.toFixed(2)}`;
    const g = groups.get(key) ?? { node: l.node, ux, uy, labels: [] };
    g.labels.push(loadLabel(l, us));
    groups.set(key, g);
  }
  const len = 26;
  return (
    <g>
      {[...groups.entries()].map(([key, g]) => {
        const x = f.sx(g.node.x);
        const y = f.sy(g.node.y);
        const tx = x - g.ux * len;
        const ty = y - g.uy * len;
        return (
          <g key={key}>
            <Arrow x1={tx} y1={ty} x2={x - g.ux * 2} y2={y - g.uy * 2} color={ACCENT} />
            <text {...HALO} x={tx + 3} y={ty - 3 - 10 * (g.labels.length - 1)} fontSize={FONT - 1} fill={ACCENT}>
              {g.labels.map((t, i) => (
                <tspan key={t + i} x={tx + 3} dy={i === 0 ? 0 : 10}>
                  {t}
                </tspan>
              ))}
            </text>
          </g>
        );
      })}
    </g>
  );
}

function Members({ f, g, color = INK, width = 2, dash }: { f: Frame; g: Geometry; color?: string; width?: number; dash?: string }) {
  return (
    <g>
      {g.members.map((m) => (
        <line key={m.id} x1={f.sx(m.a.x)} y1={f.sy(m.a.y)} x2={f.sx(m.b.x)} y2={f.sy(m.b.y)} stroke={color} strokeWidth={width} strokeDasharray={dash} />
      ))}
    </g>
  );
}

function Hinges({ f, g }: { f: Frame; g: Geometry }) {
  const out: ReactNode[] = [];
  for (const m of g.members) {
    for (const end of m.releases) {
      const [x, y] = along(f, m, end === "start" ? Math.min(m.length, 6 / f.k) : Math.max(0, m.length - 6 / f.k));
      out.push(<circle key={`${m.id}-${end}`} cx={x} cy={y} r={3} fill="white" stroke={INK} />);
    }
  }
  return <g>{out}</g>;
}

function NodeLabels({ f, g }: { f: Frame; g: Geometry }) {
  return (
    <g>
      {g.nodes.map((n: DrawNode) => (
        <text {...HALO} key={n.id} x={f.sx(n.x) + 4} y={f.sy(n.y) - 5} fontSize={FONT} fill={SOFT}>
          {n.id}
        </text>
      ))}
    </g>
  );
}

function Dimension({ f, g, y, us }: { f: Frame; g: Geometry; y: number; us: boolean }) {
  // overall length along the bottom, as a drafter dimensions a beam
  const { minX, maxX } = g.box;
  const x1 = f.sx(minX);
  const x2 = f.sx(maxX);
  const ft = `${fmt((maxX - minX) / 0.3048, 4)} ft`;
  const m = `${fmt(maxX - minX, 4)} m`;
  const text = us ? `${ft} (${m})` : `${m} (${ft})`;
  return (
    <g aria-hidden="true">
      <line x1={x1} y1={y} x2={x2} y2={y} stroke={SOFT} strokeWidth={0.7} />
      <line x1={x1} y1={y - 4} x2={x1} y2={y + 4} stroke={SOFT} strokeWidth={0.7} />
      <line x1={x2} y1={y - 4} x2={x2} y2={y + 4} stroke={SOFT} strokeWidth={0.7} />
      <text {...HALO} x={(x1 + x2) / 2} y={y - 3} fontSize={FONT - 1} textAnchor="middle" fill={SOFT}>
        {text}
      </text>
    </g>
  );
}

function Figure({ title, caption, children, f, testId }: { title: string; caption?: string; children: ReactNode; f: Frame; testId?: string }) {
  return (
    <figure className="mb-4 break-inside-avoid" data-testid={testId}>
      <svg viewBox={`0 0 ${f.width} ${f.height}`} width="100%" role="img" aria-label={title} className="block border border-rule bg-white" style={{ maxHeight: 360 }}>
        <title>{title}</title>
        {children}
      </svg>
      <figcaption className="mt-1 text-xs text-ink-soft">
        <span className="font-medium text-ink">{title}</span>
        {caption ? ` — ${caption}` : null}
      </figcaption>
    </figure>
  );
}

const WIDTH = 720;

/** Loads drawn on the busiest member or node (how many bands the drawing must make room for). */
function loadStacks(g: Geometry): number[] {
  const count = new Map<string, number>();
  return g.loads.map((l) => {
    if (l.type === "node") return 0;
    const key = `m${l.member.id}${l.type}`;
    const n = count.get(key) ?? 0;
    count.set(key, n + 1);
    return n;
  });
}

function frameOf(g: Geometry, withLoads = false) {
  const beam = g.box.maxY - g.box.minY < 1e-9;
  const bands = withLoads ? Math.max(1, ...loadStacks(g).map((s) => s + 1)) : 1;
  // node loads stack one label line per case
  const perNode = new Map<string, number>();
  if (withLoads) for (const l of g.loads) if (l.type === "node") perNode.set(l.node.id, (perNode.get(l.node.id) ?? 0) + 1);
  const lines = Math.max(1, ...perNode.values());
  const extra = LOAD_BAND * (bands - 1) + 10 * (lines - 1);
  if (!beam) return frameFor(g, WIDTH, { minHeight: 180, maxHeight: 340 + extra, pad: 54 + extra });
  const height = 110 + LOAD_BAND * bands;
  return frameFor(g, WIDTH, { minHeight: height, maxHeight: height, pad: 48, baseline: withLoads ? 62 : height / 2 });
}

/** The structure as the examiner described it: members, supports, hinges, loads by case. */
export function StructureDrawing({ g, us = true, title = "Structure and loads" }: { g: Geometry; us?: boolean; title?: string }) {
  if (g.members.length === 0) return <p className="text-sm text-ink-soft">Nothing to draw yet: add nodes and members.</p>;
  const f = frameOf(g, true);
  const beam = g.box.maxY - g.box.minY < 1e-9;
  // stack loads of the same member so their arrows do not overprint
  const stacks = loadStacks(g);
  return (
    <Figure title={title} caption="loads by case; arrows show direction" f={f} testId="structure-drawing">
      <Members f={f} g={g} />
      <Hinges f={f} g={g} />
      {g.supports.map((s) => (
        <SupportSymbol key={s.node.id} f={f} s={s} g={g} />
      ))}
      {g.loads.map((l, i) => (l.type === "node" ? null : <LoadGlyph key={i} f={f} l={l} us={us} stack={stacks[i] ?? 0} />))}
      <NodeLoads f={f} loads={g.loads.filter((l): l is Extract<DrawLoad, { type: "node" }> => l.type === "node")} us={us} />
      <NodeLabels f={f} g={g} />
      {beam ? <Dimension f={f} g={g} y={f.height - 10} us={us} /> : null}
    </Figure>
  );
}

function niceFactor(target: number): number {
  if (!(target > 0) || !Number.isFinite(target)) return 1;
  const p = 10 ** Math.floor(Math.log10(target));
  const m = target / p;
  const step = m >= 5 ? 5 : m >= 2 ? 2 : 1;
  return step * p;
}

/** The deflected shape, dashed and exaggerated by a stated factor, over the undeflected members. */
export function DeflectedShape({ g, result }: { g: Geometry; result: SolveResult }) {
  if (g.members.length === 0) return null;
  const f = frameOf(g);
  const byId = new Map(result.members.map((m) => [m.id, m]));
  let umax = 0;
  for (const m of result.members) for (const s of m.stations) umax = Math.max(umax, Math.hypot(s.ux_m, s.uy_m));
  if (!(umax > 0)) return null;
  const beam = g.box.maxY - g.box.minY < 1e-9;
  // a truss or frame deflected by more than about a third of its depth reads as a different structure
  const depthPx = (g.box.maxY - g.box.minY) * f.k;
  const targetPx = beam ? 34 : Math.min(0.1 * Math.max(f.width, f.height), 0.35 * depthPx);
  const factor = niceFactor(targetPx / (umax * f.k));
  const us = result.units.display.displacement === "in";
  const worst = [...result.members].sort((a, b) => Math.abs(b.extreme.deflection_m) - Math.abs(a.extreme.deflection_m))[0];
  const paths = g.members.map((m) => {
    const r = byId.get(m.id);
    if (!r || r.stations.length === 0) return null;
    const { c, s } = unit(m);
    const pts = r.stations.map((st) => `${f.sx(m.a.x + c * st.x_m + st.ux_m * factor)},${f.sy(m.a.y + s * st.x_m + st.uy_m * factor)}`);
    return <polyline key={m.id} points={pts.join(" ")} fill="none" stroke={BAD} strokeWidth={1.6} strokeDasharray="6 4" />;
  });
  let mark: ReactNode = null;
  if (result.kind !== "beam") {
    // a truss or frame member's transverse deflection includes its rigid-body motion: mark the largest vertical movement instead
    let best: { m: DrawMember; x: number; ux: number; uy: number } | null = null;
    for (const m of g.members) {
      for (const st of byId.get(m.id)?.stations ?? []) if (!best || Math.abs(st.uy_m) > Math.abs(best.uy)) best = { m, x: st.x_m, ux: st.ux_m, uy: st.uy_m };
    }
    if (best && best.uy !== 0) {
      const { c, s } = unit(best.m);
      const px = f.sx(best.m.a.x + c * best.x + best.ux * factor);
      const py = f.sy(best.m.a.y + s * best.x + best.uy * factor);
      mark = (
        <g>
          <circle cx={px} cy={py} r={2.5} fill={BAD} />
          <text {...HALO} x={px + 6} y={py + 4} fontSize={FONT} fill={BAD}>
            {`largest vertical movement ${bothLengths(Math.abs(best.uy), us ? "in" : "mm")}`}
          </text>
        </g>
      );
    }
  } else if (worst) {
    const m = g.members.find((x) => x.id === worst.id);
    if (m) {
      const { c, s } = unit(m);
      const x = worst.extreme.x_m;
      const st = nearestStation(worst, x);
      const px = f.sx(m.a.x + c * x + (st?.ux_m ?? 0) * factor);
      const py = f.sy(m.a.y + s * x + (st?.uy_m ?? 0) * factor);
      mark = (
        <g>
          <circle cx={px} cy={py} r={2.5} fill={BAD} />
          <text {...HALO} x={px + 5} y={py + (worst.extreme.deflection_m < 0 ? 14 : -6)} fontSize={FONT} fill={BAD}>
            {`Δmax ${bothLengths(Math.abs(worst.extreme.deflection_m), us ? "in" : "mm")} (${worst.id})`}
          </text>
        </g>
      );
    }
  }
  return (
    <Figure title="Deflected shape" caption={`all loads together, unfactored; displacements drawn × ${factor.toLocaleString("en-US")} (not to scale)`} f={f} testId="deflected-shape">
      <Members f={f} g={g} color={SOFT} width={1} />
      {g.supports.map((s) => (
        <SupportSymbol key={s.node.id} f={f} s={s} g={g} />
      ))}
      {paths}
      {mark}
      <NodeLabels f={f} g={g} />
    </Figure>
  );
}

function nearestStation(m: MemberResult, x: number) {
  let best = m.stations[0];
  for (const s of m.stations) if (best && Math.abs(s.x_m - x) < Math.abs(best.x_m - x)) best = s;
  return best;
}

type Quantity = "M" | "V" | "N";

const INFO: Record<Quantity, { title: string; caption: string; key: "M_Nm" | "V_N" | "N_N" }> = {
  M: { title: "Bending moment", caption: "drawn on the tension side (sagging below a beam); values at the peaks", key: "M_Nm" },
  V: { title: "Shear", caption: "positive shear drawn above the member (V = dM/dx); values at the peaks", key: "V_N" },
  N: { title: "Axial force", caption: "tension (T) positive; values at each member", key: "N_N" },
};

/** Moment, shear or axial-force diagram drawn off each member, peaks labelled in both unit systems. */
export function ForceDiagram({ g, result, q }: { g: Geometry; result: SolveResult; q: Quantity }) {
  if (g.members.length === 0) return null;
  const f = frameOf(g);
  const info = INFO[q];
  const byId = new Map(result.members.map((m) => [m.id, m]));
  let vmax = 0;
  for (const m of result.members) for (const s of m.stations) vmax = Math.max(vmax, Math.abs(s[info.key]));
  const us = result.units.display.displacement === "in";
  const value = (v: number) => (q === "M" ? bothMoments(v, us ? "kip" : "kN") : bothForces(v, us ? "kip" : "kN"));
  if (!(vmax > 1e-9)) {
    return (
      <Figure title={info.title} caption="zero everywhere" f={f}>
        <Members f={f} g={g} color={SOFT} width={1} />
      </Figure>
    );
  }
  const beam = g.box.maxY - g.box.minY < 1e-9;
  const scalePx = (beam ? 40 : 0.09 * Math.max(f.width, f.height)) / vmax;
  // moment: tension side is local −y for sagging (+); shear and axial: + toward local +y
  const side = q === "M" ? -1 : 1;
  const shapes: ReactNode[] = [];
  const labels: ReactNode[] = [];
  for (const m of g.members) {
    const r = byId.get(m.id);
    if (!r || r.stations.length === 0) continue;
    if (q === "N" && g.kind === "truss") {
      const n = r.stations[0]?.N_N ?? 0;
      const [mx, my] = along(f, m, m.length / 2, 5);
      const tension = n > 0;
      let angle = (Math.atan2(-(m.b.y - m.a.y), m.b.x - m.a.x) * 180) / Math.PI;
      if (angle > 90) angle -= 180;
      if (angle < -90) angle += 180;
      shapes.push(
        <line key={m.id} x1={f.sx(m.a.x)} y1={f.sy(m.a.y)} x2={f.sx(m.b.x)} y2={f.sy(m.b.y)} stroke={Math.abs(n) < 1e-6 * vmax ? SOFT : tension ? ACCENT : BAD} strokeWidth={1 + (3 * Math.abs(n)) / vmax} strokeDasharray={tension || Math.abs(n) < 1e-6 * vmax ? undefined : "5 3"} />,
      );
      labels.push(
        <text {...HALO} key={`l${m.id}`} x={mx} y={my} fontSize={FONT - 2} fill={INK} textAnchor="middle" transform={`rotate(${angle.toFixed(1)} ${mx.toFixed(1)} ${my.toFixed(1)})`}>
          {`${m.id} ${Math.abs(n) < 1e-6 * vmax ? "0" : `${value(Math.abs(n)).split(" (")[0]} ${tension ? "T" : "C"}`}`}
        </text>,
      );
      continue;
    }
    const pts = r.stations.map((s) => along(f, m, s.x_m, side * s[info.key] * scalePx));
    const [ax, ay] = along(f, m, 0);
    const [bx, by] = along(f, m, m.length);
    const poly = [`${ax},${ay}`, ...pts.map((p) => `${p[0]},${p[1]}`), `${bx},${by}`].join(" ");
    shapes.push(<polygon key={m.id} points={poly} fill={q === "M" ? "rgba(20,102,93,0.12)" : "rgba(60,79,122,0.12)"} stroke={q === "M" ? ACCENT : "#3c4f7a"} strokeWidth={1.1} />);
    // label the largest positive and the largest negative value of each member
    let hi = r.stations[0];
    let lo = r.stations[0];
    for (const s of r.stations) {
      if (hi && s[info.key] > hi[info.key]) hi = s;
      if (lo && s[info.key] < lo[info.key]) lo = s;
    }
    for (const s of [hi, lo]) {
      if (!s || Math.abs(s[info.key]) < 0.02 * vmax) continue;
      if (s === lo && hi && Math.abs(hi[info.key] - lo[info.key]) < 1e-9 * vmax) continue;
      const [px, py] = along(f, m, s.x_m, side * s[info.key] * scalePx);
      const below = (side * s[info.key] < 0) === (unit(m).c >= 0);
      labels.push(
        <text {...HALO} key={`${m.id}-${s.x_m}-${s[info.key]}`} x={px} y={py + (below ? 12 : -4)} fontSize={FONT - 1} textAnchor="middle" fill={INK}>
          {value(s[info.key])}
        </text>,
      );
    }
  }
  return (
    <Figure title={info.title} caption={info.caption} f={f} testId={`diagram-${q}`}>
      <Members f={f} g={g} color={SOFT} width={1} />
      {shapes}
      {g.supports.map((s) => (
        <SupportSymbol key={s.node.id} f={f} s={s} g={g} />
      ))}
      {labels}
    </Figure>
  );
}

/** The set a result page shows: structure, deflected shape, moment and shear (beams, frames) or axial (trusses, frames). */
export function ResultDiagrams({ g, result }: { g: Geometry; result: SolveResult }) {
  const us = result.units.display.displacement === "in";
  const hasAxial = result.members.some((m) => m.stations.some((s) => Math.abs(s.N_N) > 1e-6));
  return (
    <div>
      <StructureDrawing g={g} us={us} />
      <DeflectedShape g={g} result={result} />
      {result.kind !== "truss" ? (
        <>
          <ForceDiagram g={g} result={result} q="M" />
          <ForceDiagram g={g} result={result} q="V" />
        </>
      ) : null}
      {result.kind === "truss" || (result.kind === "frame" && hasAxial) ? <ForceDiagram g={g} result={result} q="N" /> : null}
    </div>
  );
}

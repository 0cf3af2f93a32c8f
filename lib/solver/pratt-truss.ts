/**
 * A generated Pratt truss model file (for the benchmark and the scaling tests): `panels`
 * panels of `panel` ft, depth `depth` ft, bottom-chord nodes L0…Ln, top-chord nodes U1…U(n−1),
 * pin at L0, roller at Ln, a panel-point load on every interior bottom node. Diagonals slope
 * down toward mid-span (tension under gravity load). Members: 4n − 3 for 2n nodes, so the
 * truss is statically determinate (m + r = 2j).
 */
export function prattTrussModel(
  panels: number,
  options: { panel?: number; depth?: number; findCount?: number } = {},
): Record<string, unknown> {
  const n = Math.max(2, Math.round(panels));
  const panel = options.panel ?? 10;
  const depth = options.depth ?? 8;
  const nodes: Record<string, [string, string]> = {};
  for (let i = 0; i <= n; i++) nodes[`L${i}`] = [`${i * panel} ft`, "0 ft"];
  for (let i = 1; i < n; i++) nodes[`U${i}`] = [`${i * panel} ft`, `${depth} ft`];
  const members: Record<string, { ends: [string, string]; E: string; A: string }> = {};
  const chord = { E: "29000 ksi", A: "12 in^2" };
  const web = { E: "29000 ksi", A: "6 in^2" };
  for (let i = 0; i < n; i++) members[`B${i}`] = { ends: [`L${i}`, `L${i + 1}`], ...chord };
  for (let i = 1; i < n - 1; i++) members[`T${i}`] = { ends: [`U${i}`, `U${i + 1}`], ...chord };
  for (let i = 1; i < n; i++) members[`V${i}`] = { ends: [`L${i}`, `U${i}`], ...web };
  const half = n / 2;
  for (let i = 0; i < n; i++) {
    let ends: [string, string];
    if (i === 0) ends = ["L0", "U1"];
    else if (i === n - 1) ends = [`U${n - 1}`, `L${n}`];
    else if (i < half) ends = [`U${i}`, `L${i + 1}`];
    else ends = [`L${i}`, `U${i + 1}`];
    members[`D${i}`] = { ends, ...(i === 0 || i === n - 1 ? chord : web) };
  }
  const loads = [];
  for (let i = 1; i < n; i++) loads.push({ node: `L${i}`, Fy: "-10 kip", case: i % 2 === 0 ? "D" : "L" });
  const findCount = Math.min(options.findCount ?? 10, n - 1);
  const find = [];
  for (let k = 1; k <= findCount; k++) find.push({ node: `L${Math.max(1, Math.round((k * n) / (findCount + 1)))}`, dof: "y" });
  return {
    title: `Generated Pratt truss, ${n} panels (bench)`,
    kind: "truss",
    nodes,
    members,
    supports: { L0: "pin", [`L${n}`]: "roller" },
    loads,
    find,
  };
}

/** Panels for a Pratt truss with about `members` members (4n − 3). */
export function prattPanelsFor(members: number): number {
  return Math.max(2, Math.round((members + 3) / 4));
}

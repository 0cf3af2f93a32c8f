/**
 * Deflection limits as data, so that a jurisdiction can pass its own table (solve options
 * `limits`). Each value is the denominator n of l/n; a missing column means the table sets
 * no limit for that load. Footnote letters follow the printed table.
 */
export interface LimitRow {
  id: string;
  label: string;
  /** L or Lr alone */
  live?: number;
  /** S, or W × windFactor (footnote f) */
  snowWind?: number;
  /** walls: the S-or-W column limits wind only */
  windOnly?: boolean;
  /** D + L: creep part of D (footnote d; steel 0, footnote g) plus L */
  total?: number;
  /** the total limit is on the full immediate D + L (footnote a's "total load"), not on creep + L */
  immediateTotal?: boolean;
  footnote?: string;
}

export interface LimitsTable {
  source: string;
  rows: LimitRow[];
  /** footnote f: wind load for deflection = windFactor × component-and-cladding load */
  windFactor: number;
  /** footnote i: a cantilever is checked with l = cantileverFactor × its length */
  cantileverFactor: number;
  notes: string[];
}

export const IBC_2021_TABLE_1604_3: LimitsTable = {
  source: "IBC 2021 Table 1604.3 Deflection Limits",
  windFactor: 0.42,
  cantileverFactor: 2,
  rows: [
    { id: "roof-plaster-ceiling", label: "Roof members supporting plaster or stucco ceiling", live: 360, snowWind: 360, total: 240 },
    { id: "roof-nonplaster-ceiling", label: "Roof members supporting nonplaster ceiling", live: 240, snowWind: 240, total: 180 },
    { id: "roof-no-ceiling", label: "Roof members not supporting ceiling", live: 180, snowWind: 180, total: 120 },
    { id: "floor", label: "Floor members", live: 360, total: 240 },
    { id: "exterior-wall-plaster", label: "Exterior walls with plaster or stucco finishes", snowWind: 360, windOnly: true },
    { id: "exterior-wall-brittle", label: "Exterior walls with other brittle finishes", snowWind: 240, windOnly: true },
    { id: "exterior-wall-flexible", label: "Exterior walls with flexible finishes", snowWind: 120, windOnly: true },
    { id: "partition-plaster", label: "Interior partitions (5 psf) with plaster or stucco finishes", live: 360 },
    { id: "partition-brittle", label: "Interior partitions (5 psf) with other brittle finishes", live: 240 },
    { id: "partition-flexible", label: "Interior partitions (5 psf) with flexible finishes", live: 120 },
    { id: "farm", label: "Farm buildings", total: 180 },
    { id: "greenhouse", label: "Greenhouses", total: 120 },
    { id: "formed-metal-roofing", label: "Structural roofing of formed metal sheets (total load)", total: 60, immediateTotal: true, footnote: "a" },
    { id: "secondary-roof-metal", label: "Secondary roof members supporting formed metal roofing", live: 150, footnote: "a" },
    { id: "secondary-wall-metal", label: "Secondary wall members supporting formed metal siding", snowWind: 90, footnote: "a", windOnly: true },
  ],
  notes: [
    "l = span; for cantilevers l = twice the cantilever length (footnote i).",
    "Wind load for deflection may be taken as 0.42 × the component-and-cladding load (footnote f).",
    "The D + L limit applies to the creep part of the long-term dead-load deflection plus the short-term live-load deflection (footnote d); for steel the creep part is zero (footnote g).",
    "The table does not check ponding (footnote e).",
  ],
};

import { z } from "zod";
import type { Material } from "@/lib/solver";
import { MODULUS_UNITS, isBlank, optionalNumberText, q, tidy } from "@/lib/checks/quantities";

// Moduli for the check forms, each with the source an examiner would cite.

export interface Lumber {
  id: string;
  species: string;
  grade: string;
  /** reference E and Emin, psi */
  E: number;
  Emin: number;
  source: string;
}

const TABLE_4A = "NDS 2018 Supplement Table 4A, visually graded dimension lumber 2–4 in thick (from memory)";
const TABLE_4B = "NDS 2018 Supplement Table 4B, visually graded Southern Pine dimension lumber (from memory)";

export const LUMBER: Lumber[] = [
  { id: "dfl-ss", species: "Douglas Fir-Larch", grade: "Select Structural", E: 1_900_000, Emin: 690_000, source: TABLE_4A },
  { id: "dfl-1", species: "Douglas Fir-Larch", grade: "No.1", E: 1_700_000, Emin: 620_000, source: TABLE_4A },
  { id: "dfl-2", species: "Douglas Fir-Larch", grade: "No.2", E: 1_600_000, Emin: 580_000, source: TABLE_4A },
  { id: "hf-2", species: "Hem-Fir", grade: "No.2", E: 1_300_000, Emin: 470_000, source: TABLE_4A },
  { id: "spf-2", species: "Spruce-Pine-Fir", grade: "No.2", E: 1_400_000, Emin: 510_000, source: TABLE_4A },
  { id: "sp-2", species: "Southern Pine", grade: "No.2", E: 1_400_000, Emin: 510_000, source: TABLE_4B },
];

/** Glulam stress classes (NDS Supplement Table 5A); the name carries Ex in 10⁶ psi. */
export const GLULAM_CLASSES = ["16F-1.3E", "20F-1.5E", "24F-1.7E", "24F-1.8E", "26F-1.9E"] as const;
export const GLULAM_SOURCE = "NDS 2018 Supplement Table 5A: the stress class name carries Ex (24F-1.8E → 1.8 × 10⁶ psi)";

/** Ex of a glulam stress class, psi: "24F-1.8E" → 1,800,000; null if the name carries none. */
export function glulamE(stressClass: string): number | null {
  const m = /^\s*\d{2}F-(\d(?:\.\d{1,2})?)E\b/i.exec(stressClass);
  return m ? Number(m[1]) * 1e6 : null;
}

// AISC 360-16 (symbols and §A3, from memory): E = 29,000 ksi, G = 11,200 ksi.
export const STEEL = { E_ksi: 29_000, G_ksi: 11_200, source: "AISC 360-16: E = 29,000 ksi, G = 11,200 ksi (from memory)" };
// Aluminum Design Manual 2020, Table A.3.4, 6061-T6 (from memory).
export const ALUMINUM = { E_ksi: 10_100, G_ksi: 3_800, source: "Aluminum Design Manual 2020 Table A.3.4, 6061-T6: E = 10,100 ksi, G = 3,800 ksi (from memory)" };

/** Wood shear modulus G ≈ E/16 (USDA FPL Wood Handbook, GTR-190; from memory). */
export const WOOD_G_RATIO = 1 / 16;
/** Shear-free E over tabulated (apparent) E: 1.03 sawn, 1.05 glulam (NDS 2018 Appendix F, from memory). */
export const SHEAR_FREE = { sawn: 1.03, glulam: 1.05 };

/** ACI 318-19 §19.2.2.1(b): Ec = 57,000 √f′c (psi), normal-weight concrete. */
export function concreteEcPsi(fcPsi: number): number {
  return 57_000 * Math.sqrt(fcPsi);
}

/** The SI form of the same clause: Ec = 4,700 √f′c (MPa), ACI 318M-19 §19.2.2.1(b). */
export function concreteEcMpa(fcMpa: number): number {
  return 4_700 * Math.sqrt(fcMpa);
}

/** Poisson's ratio 0.2 for concrete (ACI 318-19 §19.2.3 commentary, from memory): G = E/2(1 + ν). */
export const CONCRETE_POISSON = 0.2;

export const MATERIAL_SOURCES = ["lumber", "glulam", "steel", "aluminum", "concrete", "direct"] as const;
export type MaterialSource = (typeof MATERIAL_SOURCES)[number];

export const MATERIAL_SOURCE_LABELS: Record<MaterialSource, string> = {
  lumber: "Sawn lumber (species and grade)",
  glulam: "Glued laminated timber (stress class)",
  steel: "Structural steel",
  aluminum: "Aluminum 6061-T6",
  concrete: "Concrete from f′c",
  direct: "E typed in",
};

export const CREEP_MATERIAL_LABELS: Record<Material, string> = {
  "sawn-dry": "Sawn lumber, dry service",
  "sawn-wet": "Sawn lumber, unseasoned or wet service",
  glulam: "Glulam",
  "i-joist": "I-joist",
  scl: "Structural composite lumber",
  clt: "Cross-laminated timber",
  panel: "Wood structural panel",
  steel: "Steel",
  aluminum: "Aluminum",
  concrete: "Concrete",
  other: "Other",
};

export const materialSchema = z
  .object({
    source: z.enum(MATERIAL_SOURCES, { error: "Choose the material." }),
    lumber: z.string().optional(),
    stressClass: z.string().optional(),
    fc: optionalNumberText("concrete strength f′c"),
    fcUnit: z.enum(["psi", "MPa"]),
    E: optionalNumberText("modulus of elasticity E"),
    G: optionalNumberText("shear modulus G"),
    eUnit: z.enum(MODULUS_UNITS),
  })
  .superRefine((m, ctx) => {
    if (m.source === "lumber" && !LUMBER.some((l) => l.id === m.lumber)) {
      ctx.addIssue({ code: "custom", path: ["lumber"], message: "Choose the species and grade." });
    }
    if (m.source === "glulam" && glulamE(m.stressClass ?? "") === null) {
      ctx.addIssue({ code: "custom", path: ["stressClass"], message: "Enter a stress class such as 24F-1.8E." });
    }
    if (m.source === "concrete") {
      if (isBlank(m.fc)) ctx.addIssue({ code: "custom", path: ["fc"], message: "Enter the concrete strength f′c." });
      else if (!(Number(m.fc) > 0)) ctx.addIssue({ code: "custom", path: ["fc"], message: "f′c must be greater than zero." });
    }
    if (m.source === "direct") {
      if (isBlank(m.E)) ctx.addIssue({ code: "custom", path: ["E"], message: "Enter the modulus of elasticity E." });
      else if (!(Number(m.E) > 0)) ctx.addIssue({ code: "custom", path: ["E"], message: "E must be greater than zero." });
      if (!isBlank(m.G) && !(Number(m.G) > 0)) ctx.addIssue({ code: "custom", path: ["G"], message: "G must be greater than zero." });
    }
  });

export type MaterialInput = z.infer<typeof materialSchema>;

export const DEFAULT_MATERIAL: MaterialInput = {
  source: "lumber",
  lumber: "dfl-2",
  stressClass: "24F-1.8E",
  fc: "4000",
  fcUnit: "psi",
  E: "",
  G: "",
  eUnit: "ksi",
};

export interface ResolvedMaterial {
  E: string;
  /** shear modulus, when known */
  G?: string;
  label: string;
  arithmetic: string;
  source: string;
  /** the creep class the material implies (IBC 2021 Table 1604.3 footnote d) */
  creep: Material;
  /** apparent (tabulated) wood E: the shear-free factor applies when shear is modelled */
  woodFamily: "sawn" | "glulam" | null;
}

const ksi = (psi: number) => psi / 1000;

/** E (and G) of a valid material input; `shear` swaps tabulated wood E for the shear-free value. */
export function resolveMaterial(m: MaterialInput, shear = false): ResolvedMaterial {
  if (m.source === "lumber") {
    const l = LUMBER.find((x) => x.id === m.lumber);
    if (!l) throw new Error("internal: material not validated");
    const E = shear ? l.E * SHEAR_FREE.sawn : l.E;
    return {
      E: q(ksi(E), "ksi"),
      G: q(ksi(l.E * WOOD_G_RATIO), "ksi"),
      label: `${l.species} ${l.grade}, E = ${tidy(l.E / 1e6)} × 10⁶ psi`,
      arithmetic: shear
        ? `shear-free E = 1.03 × ${l.E.toLocaleString("en-US")} psi = ${tidy(ksi(E))} ksi (NDS 2018 App. F, from memory); G = E/16`
        : `E = ${l.E.toLocaleString("en-US")} psi (apparent: includes shear deflection)`,
      source: l.source,
      creep: "sawn-dry",
      woodFamily: "sawn",
    };
  }
  if (m.source === "glulam") {
    const Ex = glulamE(m.stressClass ?? "");
    if (Ex === null) throw new Error("internal: material not validated");
    const E = shear ? Ex * SHEAR_FREE.glulam : Ex;
    return {
      E: q(ksi(E), "ksi"),
      G: q(ksi(Ex * WOOD_G_RATIO), "ksi"),
      label: `Glulam ${m.stressClass}, Ex = ${tidy(Ex / 1e6)} × 10⁶ psi`,
      arithmetic: shear
        ? `shear-free E = 1.05 × ${Ex.toLocaleString("en-US")} psi = ${tidy(ksi(E))} ksi (NDS 2018 App. F, from memory); G = E/16`
        : `Ex = ${Ex.toLocaleString("en-US")} psi (apparent: includes shear deflection)`,
      source: GLULAM_SOURCE,
      creep: "glulam",
      woodFamily: "glulam",
    };
  }
  if (m.source === "steel") {
    return { E: q(STEEL.E_ksi, "ksi"), G: q(STEEL.G_ksi, "ksi"), label: "Structural steel, E = 29,000 ksi", arithmetic: "E = 29,000 ksi", source: STEEL.source, creep: "steel", woodFamily: null };
  }
  if (m.source === "aluminum") {
    return { E: q(ALUMINUM.E_ksi, "ksi"), G: q(ALUMINUM.G_ksi, "ksi"), label: "Aluminum 6061-T6, E = 10,100 ksi", arithmetic: "E = 10,100 ksi", source: ALUMINUM.source, creep: "aluminum", woodFamily: null };
  }
  if (m.source === "concrete") {
    const fc = Number(m.fc);
    if (m.fcUnit === "psi") {
      const Ec = concreteEcPsi(fc);
      return {
        E: q(Number(ksi(Ec).toPrecision(6)), "ksi"),
        G: q(Number(ksi(Ec / (2 * (1 + CONCRETE_POISSON))).toPrecision(6)), "ksi"),
        label: `Concrete f′c = ${fc.toLocaleString("en-US")} psi, Ec = ${Math.round(ksi(Ec)).toLocaleString("en-US")} ksi`,
        arithmetic: `Ec = 57,000 √${fc} = ${Math.round(Ec).toLocaleString("en-US")} psi (gross section; cracking not included)`,
        source: "ACI 318-19 §19.2.2.1(b): Ec = 57,000 √f′c psi, normal-weight concrete",
        creep: "concrete",
        woodFamily: null,
      };
    }
    const Ec = concreteEcMpa(fc);
    return {
      E: q(Number(Ec.toPrecision(6)), "MPa"),
      G: q(Number((Ec / (2 * (1 + CONCRETE_POISSON))).toPrecision(6)), "MPa"),
      label: `Concrete f′c = ${fc} MPa, Ec = ${Math.round(Ec).toLocaleString("en-US")} MPa`,
      arithmetic: `Ec = 4,700 √${fc} = ${Math.round(Ec).toLocaleString("en-US")} MPa (gross section; cracking not included)`,
      source: "ACI 318M-19 §19.2.2.1(b): Ec = 4,700 √f′c MPa, normal-weight concrete",
      creep: "concrete",
      woodFamily: null,
    };
  }
  return {
    E: q(m.E ?? "", m.eUnit),
    ...(isBlank(m.G) ? {} : { G: q(m.G ?? "", m.eUnit) }),
    label: `E = ${m.E} ${m.eUnit}`,
    arithmetic: "as typed",
    source: "typed in by the examiner",
    creep: "other",
    woodFamily: null,
  };
}

// The demo models (invented Larkspur Falls scenario) for the UI and the tests. Each is a plain
// model file object, ready for `solve()`.
import continuousBeam from "@/lib/solver/examples/continuous-beam.model.json";
import floorJoist from "@/lib/solver/examples/floor-joist-j1.model.json";
import glulamBeam from "@/lib/solver/examples/glulam-beam-gb1.model.json";
import portalFrame from "@/lib/solver/examples/portal-frame.model.json";
import roofTruss from "@/lib/solver/examples/roof-truss.model.json";
import steelGirder from "@/lib/solver/examples/steel-girder-cantilever.model.json";

export interface ExampleModel {
  /** the file name without ".model.json" */
  id: string;
  title: string;
  model: unknown;
}

export const EXAMPLE_MODELS: readonly ExampleModel[] = [
  { id: "floor-joist-j1", title: floorJoist.title, model: floorJoist },
  { id: "glulam-beam-gb1", title: glulamBeam.title, model: glulamBeam },
  { id: "steel-girder-cantilever", title: steelGirder.title, model: steelGirder },
  { id: "continuous-beam", title: continuousBeam.title, model: continuousBeam },
  { id: "roof-truss", title: roofTruss.title, model: roofTruss },
  { id: "portal-frame", title: portalFrame.title, model: portalFrame },
];

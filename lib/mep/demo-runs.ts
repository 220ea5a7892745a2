// The demo project's own services (our invented scenario) on the Northfield roof (lib/analysis/demo-roof.ts), as
// data the seed (scripts/seed/demo-runs.ts) stores and the tests check against the analysis.
import type { RunInput } from "./schemas";

/** The three runs of the demo's story, by the member each one cuts (README "What to try"). */
export const STORY_RUNS = { zeroEverywhere: "FA-01", zeroUnderGravity: "HW-01", workingChord: "SA-02" } as const;

export const DEMO_RUNS: RunInput[] = [
  {
    id: "FA-01",
    name: "Fresh-air intake through the west gable",
    system: "fresh air",
    profile: { shape: "rectangular", width: 0.6, height: 0.3, rotation: 0 },
    insulation: 0.025,
    clearance: 0.05,
    weightPerMetre: 0.3,
    points: [{ x: -2, y: 16.5, z: 1.6 }, { x: 0.6, y: 16.5, z: 1.6 }, { x: 0.6, y: 16.5, z: -1.5 }],
  },
  {
    id: "HW-01",
    name: "Heating flow along the west wall",
    system: "heating",
    profile: { shape: "round", diameter: 0.1 },
    insulation: 0.03,
    clearance: 0.05,
    weightPerMetre: 0.25,
    points: [{ x: 0.75, y: 3, z: 0 }, { x: 0.75, y: 12, z: 0 }],
  },
  {
    id: "SA-02",
    name: "Supply-air riser to the court",
    system: "supply air",
    profile: { shape: "round", diameter: 0.4 },
    insulation: 0.025,
    clearance: 0.05,
    weightPerMetre: 0.3,
    points: [{ x: 24, y: 16.5, z: -3 }, { x: 24, y: 16.5, z: 1 }],
  },
  {
    id: "SA-01",
    name: "Supply air main, hall east",
    system: "supply air",
    profile: { shape: "rectangular", width: 0.8, height: 0.4, rotation: 0 },
    insulation: 0.025,
    clearance: 0.05,
    weightPerMetre: 0.45,
    points: [{ x: 1.5, y: 18, z: 0.9 }, { x: 21, y: 18, z: 0.9 }, { x: 22.5, y: 19.5, z: 0.9 }, { x: 33, y: 19.5, z: 0.9 }, { x: 33, y: 27, z: 0.9 }],
  },
  {
    id: "CHW-01",
    name: "Chilled water flow to the air handler",
    system: "chilled water",
    profile: { shape: "round", diameter: 0.15 },
    insulation: 0.03,
    clearance: 0.05,
    weightPerMetre: 0.35,
    points: [{ x: 6, y: 3, z: 0.6 }, { x: 36, y: 3, z: 0.6 }, { x: 36, y: 9, z: 0.1 }],
  },
  {
    id: "SPR-01",
    name: "Sprinkler main, court zone",
    system: "sprinkler",
    profile: { shape: "round", diameter: 0.1 },
    insulation: 0,
    clearance: 0.05,
    weightPerMetre: 0.2,
    points: [{ x: 12, y: 12, z: -0.16 }, { x: 27, y: 12, z: -0.16 }],
  },
  {
    id: "CT-01",
    name: "Cable tray to the scoreboard",
    system: "cable tray",
    profile: { shape: "rectangular", width: 0.3, height: 0.1, rotation: 90 },
    insulation: 0,
    clearance: 0.05,
    weightPerMetre: 0.15,
    points: [{ x: 24.6, y: 13.5, z: 1.2 }, { x: 24.6, y: 22.5, z: 1.2 }],
  },
];

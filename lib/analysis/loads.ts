import type { TrussModel } from "./model";
import { buildTopology, type Topology } from "./topology";

/**
 * Full 3n nodal load vector (kN) of one load case: its nodal loads plus, when the case carries self-weight,
 * area x length x unit weight of every member, half to each end node, acting in -z.
 * Pass the topology when it is already built to skip rebuilding it.
 */
export function loadVectorForCase(model: TrussModel, loadCaseId: string, topology: Topology = buildTopology(model)): Float64Array {
  const loadCase = model.loadCases.find((c) => c.id === loadCaseId);
  if (!loadCase) throw new Error(`no load case "${loadCaseId}"`);
  const f = new Float64Array(3 * topology.nodeIds.length);
  for (const load of loadCase.nodalLoads) {
    const k = topology.nodeIndex.get(load.node);
    if (k === undefined) throw new Error(`load case "${loadCaseId}" loads a missing node "${load.node}"`);
    f[3 * k] += load.fx;
    f[3 * k + 1] += load.fy;
    f[3 * k + 2] += load.fz;
  }
  if (loadCase.selfWeight) {
    const materials = new Map(model.materials.map((m) => [m.id, m]));
    const weightPerLength = new Map(model.sections.map((s) => [s.id, s.area * (materials.get(s.material)?.unitWeight ?? 0)]));
    model.members.forEach((member, e) => {
      const half = 0.5 * (weightPerLength.get(member.section) ?? 0) * topology.length[e];
      f[3 * topology.memberI[e] + 2] -= half;
      f[3 * topology.memberJ[e] + 2] -= half;
    });
  }
  return f;
}

import { beforeEach, describe, expect, it } from "vitest";
import type { InfluenceMap } from "@/lib/review/influence";
import { useViewerStore } from "./viewer-store";

// An influence map as lib/review's influenceMap returns it (values invented for the store's bookkeeping only).
const mapOf = (member: string): InfluenceMap => ({
  member,
  values: [{ node: "T1", value: 0.5 }, { node: "T2", value: -0.25 }],
  largestTension: { node: "T1", value: 0.5 },
  largestCompression: { node: "T2", value: -0.25 },
});

describe("influence map in the viewer store", () => {
  beforeEach(() => useViewerStore.getState().reset("C1"));

  it("shows the map of the selected member and clears it when the selection changes", () => {
    const store = useViewerStore.getState();
    store.selectMember("M12");
    store.showInfluence(mapOf("M12"));
    expect(useViewerStore.getState().influence?.member).toBe("M12");
    store.selectMember("M12");
    expect(useViewerStore.getState().influence?.member).toBe("M12");
    store.selectMember("M13");
    expect(useViewerStore.getState().influence).toBeNull();
  });

  it("drops an answer that arrives after another member was selected", () => {
    const store = useViewerStore.getState();
    store.selectMember("M13");
    store.showInfluence(mapOf("M12"));
    expect(useViewerStore.getState().influence).toBeNull();
  });

  it("clears the map when another revision is opened, and on request", () => {
    const store = useViewerStore.getState();
    store.selectMember("M12");
    store.showInfluence(mapOf("M12"));
    store.reset("C2");
    expect(useViewerStore.getState().influence).toBeNull();
    store.selectMember("M12");
    store.showInfluence(mapOf("M12"));
    store.showInfluence(null);
    expect(useViewerStore.getState().influence).toBeNull();
  });
});

describe("placing a pin with a click", () => {
  // A fake picker: member M7 is under x < 100, nothing elsewhere (the real one is tested in picking.test.ts).
  const picker = {
    pickAt: (x: number) => (x < 100 ? { kind: "member" as const, id: "M7", point: [1, 2, 3] as [number, number, number] } : null),
    screenOf: () => null,
  };
  beforeEach(() => {
    useViewerStore.getState().reset("C1");
    useViewerStore.getState().registerPicker(picker);
  });

  it("keeps the member and the point clicked, goes back to selecting, and selects nothing meanwhile", () => {
    const store = useViewerStore.getState();
    store.setTool("pin");
    store.clickAt(50, 50);
    const s = useViewerStore.getState();
    expect(s.pinSpot).toEqual({ kind: "member", id: "M7", point: [1, 2, 3] });
    expect(s.tool).toBe("select");
    expect(s.selectedMemberId).toBeNull();
  });

  it("says a miss was a miss and waits for another click", () => {
    const store = useViewerStore.getState();
    store.setTool("pin");
    store.clickAt(500, 50);
    expect(useViewerStore.getState().pinSpot).toBe("missed");
    expect(useViewerStore.getState().tool).toBe("pin");
    store.clickAt(20, 50);
    expect(useViewerStore.getState().pinSpot).toMatchObject({ id: "M7" });
    store.clearPinSpot();
    expect(useViewerStore.getState().pinSpot).toBeNull();
  });
});

describe("camera pose across canvases (issue 17 item 9: the roof is refitted when the revision changes)", () => {
  const pose = { position: [60, -40, 30] as [number, number, number], target: [24, 18, 3] as [number, number, number] };
  const controllerAt = (at: typeof pose) => ({ getPose: () => at }) as unknown as Parameters<ReturnType<typeof useViewerStore.getState>["registerController"]>[0];

  it("forgets the pose of a camera that goes away, so the next roof is framed afresh", () => {
    const store = useViewerStore.getState();
    store.registerController(controllerAt(pose));
    expect(useViewerStore.getState().cameraPose).toEqual(pose);
    store.registerController(null);
    expect(useViewerStore.getState().cameraPose).toBeNull();
  });

  it("keeps a pose asked for while no camera is there (a follower joining), for the next camera to take", () => {
    const store = useViewerStore.getState();
    store.registerController(null);
    store.setCameraPose(pose);
    expect(useViewerStore.getState().cameraPose).toEqual(pose);
  });
});

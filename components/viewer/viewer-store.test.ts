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

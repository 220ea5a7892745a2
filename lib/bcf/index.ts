export * from "./types";
export { BCF_LIMITS, inspectBcf, readBcf } from "./read";
export { bcfEntries, writeBcf } from "./write";
export { fromBcfViewpoint, savePinViewSchema, SNAPSHOT_BYTES, toBcfViewpoint, type SavePinViewInput, type StoredPinViewpoint } from "./viewpoint";
export { viewpointSchema, type Viewpoint } from "@/lib/realtime/viewpoint";
export { disciplineOf, pinStateOf, TOPIC_STATUSES, TOPIC_TYPES } from "./pins";
export { bcfFromPins, type PinForBcf } from "./from-pins";

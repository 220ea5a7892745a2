export * from "./types";
export { BCF_LIMITS, inspectBcf, readBcf } from "./read";
export { bcfEntries, writeBcf } from "./write";
export { fromBcfViewpoint, pinViewpointSchema, savePinViewSchema, SNAPSHOT_BYTES, toBcfViewpoint, type SavePinViewInput, type PinViewpoint, type StoredPinViewpoint } from "./viewpoint";
export { disciplineOf, pinStateOf, TOPIC_STATUSES, TOPIC_TYPES } from "./pins";
export { bcfFromPins, type PinForBcf } from "./from-pins";

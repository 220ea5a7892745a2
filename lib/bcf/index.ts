export * from "./types";
export { BCF_LIMITS, inspectBcf, readBcf } from "./read";
export { bcfEntries, writeBcf } from "./write";
export { fromBcfViewpoint, pinViewpointSchema, toBcfViewpoint, type PinViewpoint } from "./viewpoint";
export { disciplineOf, pinStateOf, TOPIC_STATUSES, TOPIC_TYPES } from "./pins";
export { bcfFromPins, type PinForBcf } from "./from-pins";

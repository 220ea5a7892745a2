export * from "./types";
export { BCF_LIMITS, inspectBcf, readBcf } from "./read";
export { bcfEntries, writeBcf } from "./write";

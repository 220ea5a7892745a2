// Every table of Strutroom, one file per area; drizzle-kit and db/client.ts read this file.
export * from "./core";
export * from "./review";
export * from "./files";
export * from "./mail";
export * from "./models";
export * from "./mep";
export * from "./jobs";
export * from "./live";

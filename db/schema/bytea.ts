import { customType } from "drizzle-orm/pg-core";

// drizzle-orm 0.45 has no built-in bytea column; pg returns bytea as a Buffer, which is a Uint8Array.
export const bytea = customType<{ data: Uint8Array; driverData: Buffer }>({
  dataType: () => "bytea",
  toDriver: (value) => Buffer.from(value.buffer, value.byteOffset, value.byteLength),
  fromDriver: (value) => new Uint8Array(value.buffer, value.byteOffset, value.byteLength),
});

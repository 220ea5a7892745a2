// Writing STEP (ISO 10303-21) text: IFC export is plain lines, so a small writer keeps it pure and synchronous;
// web-ifc reads the result back in the tests.

/** A STEP real: finite, always with a decimal point, exponent as E. */
export function real(value: number): string {
  if (!Number.isFinite(value)) throw new Error(`cannot write ${value} as a STEP real`);
  const [mantissa, exponent] = String(value).split("e");
  const withPoint = mantissa.includes(".") ? mantissa : `${mantissa}.`;
  return exponent === undefined ? withPoint : `${withPoint}E${exponent}`;
}

/** A STEP string: quotes and backslashes doubled, anything outside printable ASCII as \X2\ UTF-16 hex \X0\. */
export function str(value: string): string {
  let out = "";
  for (const ch of value) {
    const code = ch.codePointAt(0)!;
    if (code >= 0x20 && code <= 0x7e) out += ch === "'" ? "''" : ch === "\\" ? "\\\\" : ch;
    else {
      const units = code > 0xffff ? [0xd800 + ((code - 0x10000) >> 10), 0xdc00 + ((code - 0x10000) & 0x3ff)] : [code];
      out += `\\X2\\${units.map((u) => u.toString(16).toUpperCase().padStart(4, "0")).join("")}\\X0\\`;
    }
  }
  return `'${out}'`;
}

export const list = (items: string[]) => `(${items.join(",")})`;
export const enumValue = (name: string) => `.${name}.`;

/** Numbers the lines as they are added and wraps them in the ISO 10303-21 file frame. */
export class StepWriter {
  private lines: string[] = [];
  add(entity: string): string {
    this.lines.push(`#${this.lines.length + 1}=${entity};`);
    return `#${this.lines.length}`;
  }
  file(schema: "IFC4", name: string, isoTime: string): string {
    return [
      "ISO-10303-21;",
      "HEADER;",
      "FILE_DESCRIPTION(('ViewDefinition [ReferenceView_V1.2]'),'2;1');",
      `FILE_NAME(${str(name)},${str(isoTime)},(''),(''),'Strutroom','Strutroom','');`,
      `FILE_SCHEMA(('${schema}'));`,
      "ENDSEC;",
      "DATA;",
      ...this.lines,
      "ENDSEC;",
      "END-ISO-10303-21;",
      "",
    ].join("\n");
  }
}

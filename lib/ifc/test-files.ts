// IFC STEP text written by the tests themselves (no third-party sample files): a tiny builder for the lines they need.

/** Collects STEP lines and hands out their #ids. */
export class StepText {
  private lines: string[] = [];
  constructor(private schema: "IFC2X3" | "IFC4") {}
  add(entity: string): string {
    this.lines.push(`#${this.lines.length + 1}=${entity};`);
    return `#${this.lines.length}`;
  }
  point(x: number, y: number, z?: number): string {
    return this.add(`IFCCARTESIANPOINT((${[x, y, z].filter((v) => v !== undefined).map(real).join(",")}))`);
  }
  direction(x: number, y: number, z?: number): string {
    return this.add(`IFCDIRECTION((${[x, y, z].filter((v) => v !== undefined).map(real).join(",")}))`);
  }
  placement(origin: [number, number, number], axis?: [number, number, number], ref?: [number, number, number]): string {
    const o = this.point(...origin);
    const a = axis ? this.direction(...axis) : "$";
    const r = ref ? this.direction(...ref) : "$";
    return this.add(`IFCAXIS2PLACEMENT3D(${o},${a},${r})`);
  }
  localPlacement(relTo: string | undefined, origin: [number, number, number], axis?: [number, number, number], ref?: [number, number, number]): string {
    return this.add(`IFCLOCALPLACEMENT(${relTo ?? "$"},${this.placement(origin, axis, ref)})`);
  }
  /** Project with a length unit (MILLI or none) and any further unit lines, a model context; returns the context id. */
  project(lengthPrefix: "MILLI" | undefined, moreUnits: string[] = []): string {
    const length = this.add(`IFCSIUNIT(*,.LENGTHUNIT.,${lengthPrefix ? `.${lengthPrefix}.` : "$"},.METRE.)`);
    const more = moreUnits.map((u) => this.add(u));
    const units = this.add(`IFCUNITASSIGNMENT((${[length, ...more].join(",")}))`);
    const context = this.add(`IFCGEOMETRICREPRESENTATIONCONTEXT($,'Model',3,1.E-05,${this.placement([0, 0, 0])},$)`);
    const owner = this.schema === "IFC2X3" ? this.ownerHistory() : "$";
    this.add(`IFCPROJECT('0TestProject0000000001',${owner},'Test project',$,$,$,$,(${context}),${units})`);
    return context;
  }
  private owner?: string;
  /** IFC2X3 requires an owner history on rooted entities. */
  ownerHistory(): string {
    if (this.owner) return this.owner;
    const person = this.add(`IFCPERSON($,'Tester',$,$,$,$,$,$)`);
    const org = this.add(`IFCORGANIZATION($,'Tests',$,$,$)`);
    const pando = this.add(`IFCPERSONANDORGANIZATION(${person},${org},$)`);
    const app = this.add(`IFCAPPLICATION(${org},'1','tests','tests')`);
    this.owner = this.add(`IFCOWNERHISTORY(${pando},${app},$,.ADDED.,$,$,$,0)`);
    return this.owner;
  }
  get ownerRef(): string {
    return this.schema === "IFC2X3" ? this.ownerHistory() : "$";
  }
  /** Body shape: one extruded area solid of `profile` along the local z axis. */
  extrusion(context: string, profile: string, depth: number, position?: string): string {
    const solid = this.add(`IFCEXTRUDEDAREASOLID(${profile},${position ?? this.placement([0, 0, 0])},${this.direction(0, 0, 1)},${real(depth)})`);
    const rep = this.add(`IFCSHAPEREPRESENTATION(${context},'Body','SweptSolid',(${solid}))`);
    return this.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${rep}))`);
  }
  text(): string {
    return [
      "ISO-10303-21;",
      "HEADER;",
      "FILE_DESCRIPTION(('ViewDefinition [CoordinationView]'),'2;1');",
      "FILE_NAME('test.ifc','2026-01-01T00:00:00',('tests'),('tests'),'','','');",
      `FILE_SCHEMA(('${this.schema}'));`,
      "ENDSEC;",
      "DATA;",
      ...this.lines,
      "ENDSEC;",
      "END-ISO-10303-21;",
      "",
    ].join("\n");
  }
}

/** A STEP real: always with a decimal point. */
export const real = (v: number) => (Number.isInteger(v) ? `${v}.` : String(v));

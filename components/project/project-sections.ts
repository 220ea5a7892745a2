// The project's sections, in tab order (a plain module: the layout on the server and the tabs in the browser both
// read it). Each area of the product adds its entry here (one line each): the overview with the team is the
// foundation's; models and viewer, clashes, review sessions and the report belong to their areas; the captured-mail
// section is shown to owners while local mail capture is on.
export const PROJECT_SECTIONS = [
  { segment: "", label: "Overview" },
  { segment: "models", label: "Models" },
  { segment: "viewer", label: "3D viewer" },
  { segment: "clashes", label: "Clashes" },
  { segment: "sessions", label: "Review sessions" },
  { segment: "report", label: "Report" },
  { segment: "mail", label: "Mail" },
] as const;

export type ProjectSection = (typeof PROJECT_SECTIONS)[number]["segment"];

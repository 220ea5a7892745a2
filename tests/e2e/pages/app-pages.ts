// Every page of the app as the layout and accessibility tests walk them: where it is and what shows once it is
// ready (a test id, or "main" for a page whose content is plain).
export type AppPage = { name: string; path: (projectId: string) => string; ready: string };

/** The pages a signed-in member sees, in the demo project. */
export const SIGNED_IN_PAGES: AppPage[] = [
  { name: "projects", path: () => "/projects", ready: "project-list" },
  { name: "project overview and team", path: (id) => `/projects/${id}`, ready: "review-state" },
  { name: "models", path: (id) => `/projects/${id}/models`, ready: "revision-list" },
  { name: "revision comparison", path: (id) => `/projects/${id}/models/compare`, ready: "compare-page" },
  { name: "viewer", path: (id) => `/projects/${id}/viewer`, ready: "viewer-legend" },
  { name: "clashes", path: (id) => `/projects/${id}/clashes`, ready: "standing-caution" },
  { name: "review sessions", path: (id) => `/projects/${id}/sessions`, ready: "main" },
  { name: "report", path: (id) => `/projects/${id}/report`, ready: "main" },
  { name: "account", path: () => "/account", ready: "main" },
];

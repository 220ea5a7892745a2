// The addresses the viewer opens a revision from. One builder, because the viewer page preloads exactly these
// (a preload is only used when the later fetch asks for the same URL).

/** The summary, geometry and one result's columns of revision `number`. */
export function revisionUrls(projectId: string, number: number) {
  const base = `/api/projects/${projectId}/models/${number}`;
  return {
    summary: `${base}/summary`,
    geometry: `${base}/geometry`,
    resultColumns: (resultId: string) => `${base}/results/${encodeURIComponent(resultId)}`,
  };
}

"use client";
// The viewer screen: fetches one revision's overview and geometry (once, cached; viewed-revision.ts) and the chosen
// result's columns (binary, one result at a time, cached), then shows the toolbar, the canvas (client-only, behind a sized
// placeholder), the legend, hover read-out and the member panel. The drawing reads only the columns.
// Layout (issue 17 items 9 to 11): the stage fills the window down to the fold; the member and node panels open
// over the canvas's right side instead of narrowing it (the camera keeps its framing); the canvas takes focus,
// the arrow keys step the selection through the members drawn (the camera turns to a member stepped to off screen,
// keeping its distance), and Escape closes the panels.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import dynamic from "next/dynamic";
import { useEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { LiveJob } from "@/components/jobs/job-progress";
import { openingResultId, resultIds } from "@/lib/models/result-order";
import { comparesTwoResults } from "./colouring";
import { HoverTooltip } from "./hover-tooltip";
import { InfluenceLayer } from "./layers/influence-layer";
import { LabelsOverlay } from "./labels-layer";
import { InfluenceLegend, Legend } from "./legend";
import { MeasureReadout } from "./measure-layer";
import { MemberPanel } from "./member-panel";
import { NodePanel } from "./node-panel";
import { prepareModel } from "./prepare";
import { AnyLoadJobPanel } from "./any-load-job-panel";
import { RoofChecksPanel, RoofWarningsLine } from "./roof-checks-panel";
import { StabilityPanel } from "./stability-panel";
import { drawMechanism, UnstableView } from "./unstable-view";
import { installTestHook } from "./test-hook";
import { cameraLook } from "./config";
import { isInView, memberMidpoint, stepVisibleMember, viewerKeyAction } from "./keyboard";
import { useFillToFold } from "./use-fill-to-fold";
import { resultColumnsQuery, useResultColumns } from "./use-result-columns";
import { fetchRevision, revisionQueryKey } from "./viewed-revision";
import { useViewerStore } from "./viewer-store";
import { ViewerToolbar } from "./viewer-toolbar";

function CanvasPlaceholder({ message }: { message: string }) {
  return (
    <div className="flex h-full w-full items-center justify-center bg-board-50 text-sm text-board-700" data-testid="viewer-placeholder">
      {message}
    </div>
  );
}

const loadCanvas = () => import("./viewer-canvas");
// The 3D code is requested as soon as this module runs in the browser, before hydration, while the revision's
// preloaded answers arrive (app/…/viewer/page.tsx): not from an effect once the viewer has mounted.
if (typeof window !== "undefined") void loadCanvas();
const ViewerCanvas = dynamic(loadCanvas, { ssr: false, loading: () => <CanvasPlaceholder message="Loading the 3D view…" /> });

export function ModelViewer({
  projectId,
  revisionNumber,
  openingResultId: opening = null,
  layers,
}: {
  projectId: string;
  revisionNumber: number;
  /** The result the page preloaded the columns of (app/…/viewer/page.tsx), when it knows it. */
  openingResultId?: string | null;
  layers?: ReactNode;
}) {
  // The opening result's columns are asked for alongside the revision, not once the revision is in and the viewer
  // has chosen its result (the same choice): they are then at hand when the roof is first drawn (issue 13 navigation).
  const queryClient = useQueryClient();
  useEffect(() => {
    if (opening) void queryClient.prefetchQuery(resultColumnsQuery(projectId, revisionNumber, opening));
  }, [queryClient, projectId, revisionNumber, opening]);
  const query = useQuery({
    queryKey: revisionQueryKey(projectId, revisionNumber),
    queryFn: async () => {
      const revision = await fetchRevision(projectId, revisionNumber);
      performance.mark("viewer:results-fetched");
      return revision;
    },
    staleTime: Infinity,
    gcTime: 30 * 60_000,
  });
  const revision = query.data;
  const prepared = useMemo(() => (revision ? prepareModel(revision.model, revision.groups) : null), [revision]);
  const analysis = revision?.analysis;
  const ids = useMemo(() => (prepared && analysis ? resultIds(prepared.model, analysis.resultIds) : []), [prepared, analysis]);
  const hasReview = Boolean(revision?.analysis?.review);
  const resultId = useViewerStore((s) => s.resultId);
  const compareResultId = useViewerStore((s) => s.compareResultId);
  const colourMode = useViewerStore((s) => s.colourMode);
  const analysed = analysis?.status === "ok";
  const { columns, error: columnsError, retry: retryColumns } = useResultColumns(projectId, revisionNumber, analysed && resultId && ids.includes(resultId) ? resultId : null);
  const compare = useResultColumns(projectId, revisionNumber, analysed && comparesTwoResults(colourMode) && compareResultId && ids.includes(compareResultId) ? compareResultId : null);

  useEffect(() => {
    if (!prepared) return;
    // The same choice the page preloaded the columns of (app/…/viewer/page.tsx).
    useViewerStore.getState().reset(openingResultId(prepared.model, ids));
    // an unstable revision opens with its first mechanism drawn: how it would move is all there is to show
    const first = analysis?.status === "unstable" ? analysis.info.mechanismModes?.[0] : undefined;
    if (first) drawMechanism(0, first, prepared.nodes.ids);
  }, [prepared, ids, analysis]);

  useEffect(() => (prepared ? installTestHook(prepared) : undefined), [prepared]);
  const [stage, setStage] = useState<HTMLDivElement | null>(null);
  const stageHeight = useFillToFold(stage);
  const focusTarget = useRef<HTMLDivElement>(null);
  const selectedMemberId = useViewerStore((s) => s.selectedMemberId);
  const selectedNodeId = useViewerStore((s) => s.selectedNodeId);

  const handleKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const action = viewerKeyAction(event.key);
    if (!action || !prepared) return;
    const store = useViewerStore.getState();
    if ("clear" in action) {
      if (store.selectedMemberId === null && store.selectedNodeId === null) return;
      event.preventDefault();
      store.selectMember(null);
      store.selectNode(null);
      // Focus may have been inside the panel that is now gone: it goes back to the view, not to the page's top.
      focusTarget.current?.focus();
      return;
    }
    // Arrows belong to fields, lists and scrolling everywhere but on the focused view itself.
    const view = focusTarget.current;
    if (!view || event.target !== view) return;
    event.preventDefault();
    const current = store.selectedMemberId ? (prepared.memberIndex.get(store.selectedMemberId) ?? -1) : -1;
    const k = stepVisibleMember(prepared.memberIds.length, store.visibleMembers, current, action.step);
    if (k < 0) return;
    store.selectMember(prepared.memberIds[k]);
    const middle = memberMidpoint(prepared.nodes.positions, prepared.ends, k);
    if (!isInView(store.picker?.screenOf(middle) ?? null, view.getBoundingClientRect(), cameraLook.followMargin)) store.flyTo(middle);
  };

  if (query.isPending) return <div className="h-[75vh]"><CanvasPlaceholder message="Loading the revision and its results…" /></div>;
  if (query.isError) return <p role="alert" className="p-4 text-clash">{query.error.message}</p>;
  if (!prepared || !revision) return null;
  if (!revision.analysis && revision.job) {
    return (
      <div className="flex flex-col gap-2 p-4" data-testid="viewer-analysing">
        <p className="font-semibold">This revision is being analysed; the roof appears here when the results are stored.</p>
        <LiveJob projectId={projectId} job={revision.job} canRetry={false} onSettled={() => void query.refetch()} />
      </div>
    );
  }
  if (!analysis || analysis.status !== "ok") {
    return (
      <UnstableView info={analysis?.info} nodeIds={prepared.nodes.ids}>
        <ViewerCanvas prepared={prepared} columns={undefined} compareColumns={undefined} />
      </UnstableView>
    );
  }

  return (
    <div className="flex flex-col" onKeyDown={handleKeyDown}>
      <ViewerToolbar prepared={prepared} columns={columns} ids={ids} hasReview={hasReview} fileName={`strutroom-${revision.name}-r${revision.number}.png`.replace(/\s+/g, "-")} />
      <StabilityPanel review={revision.analysis?.review} nodeIds={prepared.nodes.ids} />
      <RoofWarningsLine info={analysis.info} />
      <AnyLoadJobPanel projectId={projectId} revision={revision} onStored={() => void query.refetch()} />
      <div ref={setStage} className="relative h-[75vh] min-w-0" style={stageHeight ? { height: stageHeight } : undefined} data-testid="viewer-stage">
        {columnsError ? (
          <p role="alert" className="absolute right-3 top-3 z-10 rounded bg-white p-2 text-sm text-clash">
            The chosen result could not be loaded: {columnsError.message}{" "}
            <button type="button" className="underline" onClick={retryColumns}>
              Try again
            </button>
          </p>
        ) : null}
        <div
          ref={focusTarget}
          tabIndex={0}
          role="group"
          aria-roledescription="3D view"
          aria-label="The roof in 3D. Arrow keys step through the members shown; Escape closes the panel."
          className="h-full w-full focus-visible:outline-offset-[-3px]"
          data-testid="viewer-focus"
        >
          <ViewerCanvas prepared={prepared} columns={columns} compareColumns={compare.columns} awaitingColumns={ids.length > 0 && !columns && !columnsError}>
            <InfluenceLayer prepared={prepared} />
            {layers}
          </ViewerCanvas>
        </div>
        <LabelsOverlay />
        <div className="pointer-events-none absolute left-3 top-3 z-10 max-h-[calc(100%-1.5rem)] overflow-y-auto">
          <Legend />
          <InfluenceLegend />
        </div>
        <div className="pointer-events-none absolute bottom-3 left-3 z-10 flex flex-col items-start gap-1">
          <MeasureReadout />
          <HoverTooltip prepared={prepared} columns={columns} />
        </div>
        <p className="sr-only" role="status" data-testid="viewer-selection-status">
          {selectedMemberId ? `Member ${selectedMemberId} selected` : selectedNodeId ? `Node ${selectedNodeId} selected` : ""}
        </p>
        <MemberPanel projectId={projectId} prepared={prepared} revision={revision} />
        <NodePanel projectId={projectId} revisionNumber={revisionNumber} prepared={prepared} />
      </div>
      <RoofChecksPanel projectId={projectId} info={analysis.info} review={revision.analysis?.review} />
    </div>
  );
}

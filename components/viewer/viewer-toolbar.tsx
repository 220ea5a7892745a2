"use client";
// Controls of the viewer in one compact bar (issue 17 item 9: the canvas gets the height): result, colouring,
// comparison, find, labels, measure, camera, PNG; the filters, section box and deflected shape sit in a "View
// options" disclosure that opens over the canvas instead of adding rows above it.
import { useEffect, useRef, useState } from "react";
import { colourModeLabels, comparesTwoResults, type ColourMode } from "./colouring";
import { autoDeflectionScale, roundedModelBox, type SectionBox } from "./filters";
import { FindBox } from "./find-box";
import { defaultCompareResult, resultLabel, type PreparedModel } from "./prepare";
import type { WireColumns } from "@/lib/models/result-columns";
import type { FilterableGroup } from "./types";
import { useViewerStore, type CameraPreset } from "./viewer-store";

const groupLabels: Record<FilterableGroup, string> = { top_chord: "Top chords", bottom_chord: "Bottom chords", diagonal: "Diagonals" };
const presetLabels: Record<CameraPreset, string> = { plan: "Plan", elevationSouth: "South elevation", elevationEast: "East elevation", isometric: "Isometric" };
const control = "rounded border border-board-200 bg-white px-2 py-1 text-sm";
/** A control with its words beside it rather than above it: one row of controls stays one row tall. */
const inline = "flex items-center gap-1 text-xs text-board-700";

function ResultSelect({ prepared, ids, value, onChange, testId, label }: { prepared: PreparedModel; ids: string[]; value: string | null; onChange: (id: string) => void; testId: string; label: string }) {
  const cases = prepared.model.loadCases.filter((c) => ids.includes(c.id));
  const combos = prepared.model.combinations.filter((c) => ids.includes(c.id));
  return (
    <label className={inline}>
      {label}
      <select className={`${control} max-w-56`} data-testid={testId} value={value ?? ""} onChange={(e) => onChange(e.target.value)}>
        <optgroup label="Load combinations">
          {combos.map((c) => (
            <option key={c.id} value={c.id}>{resultLabel(prepared.model, c.id)}</option>
          ))}
        </optgroup>
        <optgroup label="Load cases">
          {cases.map((c) => (
            <option key={c.id} value={c.id}>{resultLabel(prepared.model, c.id)}</option>
          ))}
        </optgroup>
      </select>
    </label>
  );
}

export function ViewerToolbar({ prepared, columns, ids, hasReview, fileName }: { prepared: PreparedModel; columns: WireColumns | undefined; ids: string[]; hasReview: boolean; fileName: string }) {
  const store = useViewerStore.getState();
  const resultId = useViewerStore((s) => s.resultId);
  const compareResultId = useViewerStore((s) => s.compareResultId);
  const mode = useViewerStore((s) => s.colourMode);
  const threshold = useViewerStore((s) => s.lowForceThreshold);
  const filters = useViewerStore((s) => s.filters);
  const deflection = useViewerStore((s) => s.deflection);
  const [box, setBox] = useState<SectionBox>(() => roundedModelBox(prepared.nodes.positions));

  // The options lie over the canvas: a press anywhere outside them puts them away.
  const options = useRef<HTMLDetailsElement>(null);
  useEffect(() => {
    const close = (event: PointerEvent) => {
      const details = options.current;
      if (details?.open && !details.contains(event.target as Node)) details.open = false;
    };
    document.addEventListener("pointerdown", close);
    return () => document.removeEventListener("pointerdown", close);
  }, []);

  const labelsOn = useViewerStore((s) => s.labelsOn);
  const tool = useViewerStore((s) => s.tool);
  const modes = (Object.keys(colourModeLabels) as ColourMode[]).filter((m) => (hasReview || (m !== "utilisation" && m !== "verdict")) && (!comparesTwoResults(m) || ids.length > 1));
  // Compare mode compares at once: with the next result unless another one (not the chosen one) was picked before.
  const chooseMode = (m: ColourMode) => {
    const other = useViewerStore.getState().compareResultId;
    if (comparesTwoResults(m) && (!other || other === resultId || !ids.includes(other))) store.setCompareResult(defaultCompareResult(ids, resultId));
    store.setColourMode(m);
  };
  const chooseResult = (id: string) => {
    if (comparesTwoResults(mode) && id === compareResultId) store.setCompareResult(defaultCompareResult(ids, id));
    store.setResult(id);
  };
  const updateBox = (end: "min" | "max", axis: number, value: number) => {
    const next: SectionBox = { min: [...box.min], max: [...box.max] };
    next[end][axis] = value;
    setBox(next);
    if (filters.sectionBox) store.setFilters({ sectionBox: next });
  };
  const exportPng = () => {
    const url = store.exportPng();
    if (!url) return;
    const link = document.createElement("a");
    link.href = url;
    link.download = fileName;
    link.click();
  };

  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1 border-b border-board-200 bg-white px-3 py-1.5" data-testid="viewer-toolbar">
      <ResultSelect prepared={prepared} ids={ids} value={resultId} onChange={chooseResult} testId="viewer-result" label="Result" />
      <label className={inline}>
        Colour by
        <select className={`${control} max-w-56`} data-testid="viewer-colour-mode" value={mode} onChange={(e) => chooseMode(e.target.value as ColourMode)}>
          {modes.map((m) => (
            <option key={m} value={m}>{colourModeLabels[m]}</option>
          ))}
        </select>
      </label>
      {comparesTwoResults(mode) ? (
        <ResultSelect prepared={prepared} ids={ids} value={compareResultId} onChange={store.setCompareResult} testId="viewer-compare" label="Compared with" />
      ) : null}
      {mode === "forceState" ? (
        <label className={inline}>
          Low-force below (kN)
          <input className={`${control} w-16`} type="number" min={0} step="any" value={threshold} onChange={(e) => store.setLowForceThreshold(Number(e.target.value) || 0)} data-testid="viewer-threshold" />
        </label>
      ) : null}
      <details ref={options} className="relative" data-testid="viewer-options">
        <summary className={`${control} cursor-pointer select-none`}>View options</summary>
        {/* Opens over the canvas (z above the legend) so the bar keeps its rows; on a phone it spans the screen. */}
        <div className="fixed inset-x-4 z-30 mt-1 flex flex-col gap-2 rounded-md border border-board-200 bg-white p-3 shadow-md sm:absolute sm:inset-x-auto sm:left-0 sm:top-full sm:w-[28rem]">
          <fieldset className="flex flex-wrap items-center gap-2 text-sm">
            <legend className="sr-only">Member filters</legend>
            {(Object.keys(groupLabels) as FilterableGroup[]).map((g) => (
              <label key={g} className="flex items-center gap-1">
                <input type="checkbox" checked={filters.groups[g]} onChange={(e) => store.setFilters({ groups: { ...filters.groups, [g]: e.target.checked } })} data-testid={`viewer-filter-${g}`} />
                {groupLabels[g]}
              </label>
            ))}
            <label className="flex items-center gap-1">
              <input type="checkbox" checked={filters.hideZeroForce} onChange={(e) => store.setFilters({ hideZeroForce: e.target.checked })} data-testid="viewer-filter-hide-zero" />
              Hide zero-force
            </label>
          </fieldset>
          <fieldset className="flex flex-wrap items-center gap-1 text-sm">
            <legend className="sr-only">Section box</legend>
            <label className="flex items-center gap-1">
              <input type="checkbox" checked={filters.sectionBox !== null} onChange={(e) => store.setFilters({ sectionBox: e.target.checked ? box : null })} data-testid="viewer-section-box" />
              Section box
            </label>
            {filters.sectionBox
              ? (["x", "y", "z"] as const).map((axis, a) => (
                  <span key={axis} className="flex items-center gap-0.5 font-mono text-xs">
                    {axis}
                    <input aria-label={`${axis} from (m)`} className={`${control} w-16`} type="number" step="any" value={box.min[a]} onChange={(e) => updateBox("min", a, Number(e.target.value))} data-testid={`viewer-box-${axis}-min`} />
                    <input aria-label={`${axis} to (m)`} className={`${control} w-16`} type="number" step="any" value={box.max[a]} onChange={(e) => updateBox("max", a, Number(e.target.value))} data-testid={`viewer-box-${axis}-max`} />
                  </span>
                ))
              : null}
          </fieldset>
          <fieldset className="flex flex-wrap items-center gap-1 text-sm">
            <legend className="sr-only">Deflected shape</legend>
            <label className="flex items-center gap-1">
              <input
                type="checkbox"
                checked={deflection.enabled}
                data-testid="viewer-deflection"
                onChange={(e) => {
                  const displacements = columns?.displacements;
                  const scale = deflection.scale || (displacements ? autoDeflectionScale(prepared.nodes, displacements) : 1);
                  store.setDeflection({ enabled: e.target.checked, scale });
                }}
              />
              Deflected shape ×
            </label>
            <input aria-label="Deflection scale factor" className={`${control} w-20`} type="number" min={0} step="any" value={deflection.scale} onChange={(e) => store.setDeflection({ scale: Math.max(0, Number(e.target.value) || 0) })} data-testid="viewer-deflection-scale" />
          </fieldset>
        </div>
      </details>
      <FindBox prepared={prepared} />
      <label className="flex items-center gap-1 text-sm">
        <input type="checkbox" checked={labelsOn} onChange={(e) => store.setLabelsOn(e.target.checked)} data-testid="viewer-labels-toggle" />
        Labels
      </label>
      <button type="button" className={`${control} ${tool === "measure" ? "border-selection bg-board-100" : ""}`} aria-pressed={tool === "measure"} onClick={() => store.setTool(tool === "measure" ? "select" : "measure")} data-testid="viewer-measure">
        Measure
      </button>
      <div className="flex flex-wrap items-center gap-1" role="group" aria-label="Camera">
        {(Object.keys(presetLabels) as CameraPreset[]).map((p) => (
          <button key={p} type="button" className={control} onClick={() => store.applyPreset(p)} data-testid={`viewer-preset-${p}`}>
            {presetLabels[p]}
          </button>
        ))}
        <button type="button" className={control} onClick={() => store.fitToView()} data-testid="viewer-fit">
          Fit
        </button>
        <button type="button" className={control} onClick={exportPng} data-testid="viewer-export-png">
          Export PNG
        </button>
      </div>
    </div>
  );
}

"use client";
// The roof from an IFC file (an IfcStructuralAnalysisModel, else IfcMember tubes): the server reads it into our model
// format and answers what it found, or every problem with the element's GlobalId; Save stores it as a new revision
// (a draft, analysed as a job) through the same request as a JSON upload.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { ProblemList, readingLabel } from "@/components/interop/problem-list";
import { Button, FormMessage } from "@/components/ui/form";
import type { TrussModel } from "@/lib/analysis/model";
import { ApiError, apiFetch, apiUpload } from "@/lib/http/fetcher";
import type { CreateRevisionInput } from "@/lib/models/schemas";
import { revisionsKey } from "./revision-list";

interface IfcRoofAnswer {
  model: TrussModel;
  source: "analysis model" | "physical members";
  notes: string[];
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

export function IfcRoofForm({ projectId, onSaved }: { projectId: string; onSaved: (number: number) => void }) {
  const queryClient = useQueryClient();
  const [file, setFile] = useState<File | null>(null);
  const [name, setName] = useState("");
  const read = useMutation({
    mutationFn: (chosen: File) => apiUpload<IfcRoofAnswer>(`/api/projects/${projectId}/models/ifc`, chosen),
    onSuccess: (answer) => setName(answer.model.name),
  });
  const save = useMutation({
    mutationFn: (answer: IfcRoofAnswer) => {
      const body: CreateRevisionInput = { kind: "uploadJson", name: name.trim() || undefined, fileName: `${(file?.name ?? "roof").replace(/\.ifc$/i, "")}.json`, model: answer.model };
      return apiFetch<{ revision: { number: number } }>(`/api/projects/${projectId}/models`, { method: "POST", body });
    },
    onSuccess: async ({ revision }) => {
      await queryClient.invalidateQueries({ queryKey: revisionsKey(projectId) });
      read.reset();
      onSaved(revision.number);
    },
  });
  const submit = (event: FormEvent) => {
    event.preventDefault();
    save.reset();
    if (file) read.mutate(file);
  };
  const failed = read.error ?? save.error;
  const issues = failed instanceof ApiError ? failed.issues.map((i) => ({ where: i.path, message: i.message })) : [];
  const answer = read.data;
  const model = answer?.model;
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" data-testid="ifc-roof-form">
      <div className="flex flex-col gap-1">
        <label htmlFor="ifc-roof-file" className="text-sm font-medium text-board-800">
          IFC file (.ifc, IFC2X3 or IFC4)
        </label>
        <input
          id="ifc-roof-file"
          type="file"
          accept=".ifc"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            read.reset();
            save.reset();
          }}
          data-testid="ifc-roof-file"
        />
        <p className="text-xs text-board-700">
          Read from an IFC structural analysis model (curve members, point connections, supports, materials, profiles, point loads, load groups), or else from
          IfcMember elements with circular hollow profiles (ends merged within 5 mm; add supports and loads afterwards).
        </p>
      </div>
      <Button type="submit" variant="quiet" disabled={!file || read.isPending || save.isPending} data-testid="ifc-roof-read">
        {read.isPending ? readingLabel(file, "Reading") : "Read the roof"}
      </Button>
      <FormMessage message={failed?.message} />
      <ProblemList problems={issues} testId="ifc-roof-problems" heading="What to fix in the file (GlobalId and reason):" />
      {answer && model && (
        <div className="flex flex-col gap-2 rounded-md border border-board-200 p-3 text-sm" data-testid="ifc-roof-summary">
          <p>
            Read from the {answer.source}: {plural(model.nodes.length, "node")}, {plural(model.members.length, "member")}, {plural(model.supports.length, "support")},{" "}
            {plural(model.sections.length, "section")}, {plural(model.materials.length, "material")}, {plural(model.loadCases.length, "load case")},{" "}
            {plural(model.combinations.length, "combination")}.
          </p>
          {answer.notes.length > 0 && (
            <ul className="list-disc pl-5 text-board-700" data-testid="ifc-roof-notes">
              {answer.notes.map((note) => (
                <li key={note}>{note}</li>
              ))}
            </ul>
          )}
          <label htmlFor="ifc-roof-name" className="text-sm font-medium text-board-800">
            Revision name
          </label>
          <input id="ifc-roof-name" value={name} onChange={(e) => setName(e.target.value)} className="rounded-md border border-board-200 bg-white px-3 py-2" />
          <Button type="button" onClick={() => save.mutate(answer)} disabled={save.isPending} data-testid="ifc-roof-save">
            {save.isPending ? "Saving…" : "Save as a new revision and analyse"}
          </Button>
        </div>
      )}
    </form>
  );
}

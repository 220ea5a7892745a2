"use client";

import Link from "next/link";
import { useState } from "react";
import { GenerateForm } from "./generate-form";
import { IfcRoofForm } from "./ifc-roof-form";
import { RevisionList } from "./revision-list";
import { UploadForm } from "./upload-form";

/** Revisions of the project, and for structural engineers the generate and upload forms. */
export function ModelsWorkspace({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const [saved, setSaved] = useState<number | null>(null);
  return (
    <div className="flex flex-col gap-6">
      <section className="rounded-xl border border-board-200 bg-white p-5" aria-labelledby="revisions-heading">
        <h2 id="revisions-heading" className="mb-3 text-lg font-semibold">
          Revisions
        </h2>
        {saved !== null ? (
          <p role="status" className="mb-3 text-sm text-board-800" data-testid="revision-saved">
            Revision {saved} saved as a draft; its analysis runs as a job (progress in the list). It becomes the team’s revision once you mark it current.{" "}
            <Link className="underline" href={`/projects/${projectId}/viewer?revision=${saved}`}>
              Open it in 3D
            </Link>
          </p>
        ) : null}
        <RevisionList projectId={projectId} canRetry={canEdit} canMarkCurrent={canEdit} />
      </section>
      {canEdit ? (
        <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
          <section className="rounded-xl border border-board-200 bg-white p-5" aria-labelledby="generate-heading">
            <h2 id="generate-heading" className="mb-3 text-lg font-semibold">
              Generate a double-layer grid roof
            </h2>
            <GenerateForm projectId={projectId} onSaved={setSaved} />
          </section>
          <section className="rounded-xl border border-board-200 bg-white p-5" aria-labelledby="upload-heading">
            <h2 id="upload-heading" className="mb-3 text-lg font-semibold">
              Upload a model
            </h2>
            <UploadForm projectId={projectId} onSaved={setSaved} />
          </section>
          <section className="rounded-xl border border-board-200 bg-white p-5" aria-labelledby="ifc-roof-heading">
            <h2 id="ifc-roof-heading" className="mb-3 text-lg font-semibold">
              Import the roof from IFC
            </h2>
            <IfcRoofForm projectId={projectId} onSaved={setSaved} />
          </section>
        </div>
      ) : (
        <p className="text-sm text-board-700">Only the structural engineer can add revisions.</p>
      )}
    </div>
  );
}

// Every problem a file import found, each with where it is (an IFC GlobalId, a BCF entry) and why.
export interface FileProblem {
  where: string;
  message: string;
}

export function ProblemList({ problems, testId, heading }: { problems: FileProblem[]; testId: string; heading: string }) {
  if (problems.length === 0) return null;
  return (
    <div className="rounded-md border border-clash/30 bg-clash/5 p-2 text-sm text-clash" data-testid={testId}>
      <p className="font-medium">{heading}</p>
      <ul className="mt-1 max-h-48 list-disc overflow-y-auto pl-5">
        {problems.map((p, k) => (
          <li key={k}>
            <span className="font-mono">{p.where}</span>: {p.message}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** A pending upload in words: what is happening and how big the file is. */
export function readingLabel(file: File | null, what: string): string {
  return file ? `${what} ${file.name} (${(file.size / 1024 / 1024).toFixed(1)} MB)…` : `${what}…`;
}

"use client";
// What a panel shows when its detail could not be loaded: the server's reason and a way to ask again.

export function LoadFailure({ error, retry, className = "" }: { error: Error; retry: () => void; className?: string }) {
  return (
    <p role="alert" className={`text-xs text-clash ${className}`}>
      {error.message}{" "}
      <button type="button" className="underline" onClick={retry}>
        Try again
      </button>
    </p>
  );
}

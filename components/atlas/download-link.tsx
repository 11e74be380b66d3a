/**
 * Downloads a JSON document straight from the page (a data: URL), so the file is exactly the
 * bytes shown and needs no second request.
 */
export function DownloadJson({ json, filename, children }: { json: string; filename: string; children: React.ReactNode }) {
  return (
    <a
      href={`data:application/json;charset=utf-8,${encodeURIComponent(json)}`}
      download={filename}
      className="inline-flex items-center gap-1 rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50"
    >
      {children}
    </a>
  );
}

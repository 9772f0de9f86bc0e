/** Hands a Blob to the browser as a file download. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  // The download has started from the URL by now; keep it a moment for slow browsers.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

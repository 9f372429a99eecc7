/** Hands bytes or text to the browser as a file download (a blob URL on a temporary link). */
export function downloadFile(content: BlobPart | readonly BlobPart[], fileName: string, mimeType: string): void {
  const parts = Array.isArray(content) ? [...content] : [content as BlobPart];
  const url = URL.createObjectURL(new Blob(parts, { type: mimeType }));
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.append(link);
  link.click();
  link.remove();
  // Give the download a moment to start before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Reads a file the user picked as text. */
export function readFileText(file: File): Promise<string> {
  return file.text();
}

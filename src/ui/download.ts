/** Offer a blob to the user as a downloaded file called `name`. */
export function downloadBlob(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  // Some browsers read the URL after click() returns: release it a little later.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Browser-mode saving: offer `text` as a download named `name` (no dialogs outside Electron). */
export function downloadText(name: string, text: string, mime: string): { path: string } {
  const url = URL.createObjectURL(new Blob([text], { type: mime }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.hidden = true;
  document.body.append(a);
  a.click();
  a.remove();
  // Revoked later: the browser may still be reading the blob when click() returns.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
  return { path: name };
}

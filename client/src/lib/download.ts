/** Saves text or a Blob made in the page as a file (an object URL clicked through a temporary link). */
export function downloadBlob(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadText(name: string, type: string, text: string): void {
  downloadBlob(name, new Blob([text], { type }));
}

/**
 * Files the screens hand to the user: a CSV made in the page, a chart as a PNG image. Both go
 * through a link with a `download` name, so the browser (or the desktop window) saves them
 * like any download; nothing is sent to the host.
 */

function saveUrl(url: string, fileName: string): void {
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.hidden = true;
  document.body.append(link);
  link.click();
  link.remove();
}

/** Saves text as a file (a CSV, UTF-8). */
export function saveText(text: string, fileName: string, type = 'text/csv;charset=utf-8'): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  saveUrl(url, fileName);
  // The click has started the download; the address can go once the event loop moves on.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}

/** Saves what a canvas shows as a PNG image, on a white ground. */
export function saveCanvas(canvas: HTMLCanvasElement, fileName: string): void {
  const copy = document.createElement('canvas');
  copy.width = canvas.width;
  copy.height = canvas.height;
  const context = copy.getContext('2d');
  if (context === null) return;
  context.fillStyle = '#ffffff';
  context.fillRect(0, 0, copy.width, copy.height);
  context.drawImage(canvas, 0, 0);
  saveUrl(copy.toDataURL('image/png'), fileName);
}

/** PNG download of a chart: the server's SVG drawn onto a canvas at 2× (the SVG stays the crisp original). */
export async function downloadPng(svgUrl: string, filename: string, scale = 2): Promise<void> {
  const r = await fetch(svgUrl, { credentials: 'same-origin' });
  if (!r.ok) throw new Error(`the server answered ${r.status}`);
  const text = await r.text();
  const url = URL.createObjectURL(new Blob([text], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(img.naturalWidth * scale);
    canvas.height = Math.round(img.naturalHeight * scale);
    const g = canvas.getContext('2d');
    if (!g) throw new Error('no 2D canvas');
    g.fillStyle = '#ffffff';
    g.fillRect(0, 0, canvas.width, canvas.height);
    g.drawImage(img, 0, 0, canvas.width, canvas.height);
    const blob = await new Promise<Blob | null>((res) => canvas.toBlob(res, 'image/png'));
    if (!blob) throw new Error('the browser could not encode a PNG');
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = filename;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  } finally {
    URL.revokeObjectURL(url);
  }
}

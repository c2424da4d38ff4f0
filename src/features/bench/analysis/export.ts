/** Files the Bench hands out: CSV tables (UTF-8 with a byte-order mark, RFC 4180 quoting) and PNGs. */

const quote = (v: string) => (/[",\n\r]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

export function csvText(header: string[], rows: (string | number | null)[][]): string {
  const cell = (v: string | number | null) => (v === null || (typeof v === 'number' && !Number.isFinite(v)) ? '' : quote(String(v)));
  return `\uFEFF${[header.map(quote).join(','), ...rows.map((r) => r.map(cell).join(','))].join('\r\n')}\r\n`;
}

/** Starts a download of a blob through an <a download> and a blob URL. */
export function downloadBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

export const downloadCsv = (text: string, fileName: string) => downloadBlob(new Blob([text], { type: 'text/csv;charset=utf-8' }), fileName);

/** The recording's name without its extension, safe as the start of a file name. */
export function baseName(recordingName: string): string {
  const stem = recordingName.replace(/\.[^.]+$/, '').trim();
  return stem.replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'recording';
}

/** Decimal places that keep a value of this size readable to about 4 significant digits. */
export const round = (v: number, decimals: number) => (Number.isFinite(v) ? Number(v.toFixed(decimals)) : null);

// Offers a file to the browser's download, with a file name built from the cruise name.

export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.append(a);
  a.click();
  a.remove();
  // Revoked later: some browsers read the URL after click() returns.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/** A file-system-safe slug of a cruise name. */
export function slug(name: string): string {
  const s = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return s || 'cruise';
}

/** `20260309T1400Z`, for file names. */
export function stamp(d = new Date()): string {
  return d.toISOString().slice(0, 16).replace(/[-:]/g, '') + 'Z';
}

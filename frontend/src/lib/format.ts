const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** A timestamp from the API (ISO 8601) in the reader's locale; the raw text if it does not parse. */
export function formatDateTime(value: string | null | undefined): string {
  if (!value) return '—';
  const date = new Date(value);
  return Number.isNaN(date.getTime()) ? value : dateTimeFormat.format(date);
}

/** A number with a fixed count of decimals, or "—" for a missing or non-finite value. */
export function formatFixed(value: number | null | undefined, decimals: number): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(decimals);
}

/** "+0.123" / "−0.456": a signed value with a true minus sign (U+2212), as margins are shown. */
export function formatSigned(value: number, decimals = 3): string {
  return `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(decimals)}`;
}

/**
 * Parses a number typed by a user: plain decimal or exponent notation, optional sign, nothing else
 * (no units, no thousands separators). Returns null for anything else, including an empty field.
 */
export function parseNumberInput(text: string): number | null {
  const trimmed = text.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(trimmed)) return null;
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : null;
}

/** Parses a list like "0, 15, 30" (commas, semicolons or spaces); null when any entry is not a number. */
export function parseNumberList(text: string): number[] | null {
  const parts = text
    .split(/[\s,;]+/)
    .map((p) => p.trim())
    .filter((p) => p !== '');
  const values = parts.map(parseNumberInput);
  return values.every((v): v is number => v !== null) ? values : null;
}

/** A form field's value as the text typed: strings as they are, numbers in their usual form, anything else empty. */
export function fieldText(value: unknown): string {
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'bigint' || typeof value === 'boolean')
    return String(value);
  return '';
}

/** A size limit as people write it: "200 kB", "1 MB", "2 MB" (decimal units, no trailing zeros). */
export function formatSizeLimit(bytes: number): string {
  if (bytes < 1000) return `${bytes} bytes`;
  if (bytes < 1_000_000) return `${Number((bytes / 1000).toPrecision(3))} kB`;
  return `${Number((bytes / 1_000_000).toPrecision(3))} MB`;
}

/** A file size as people read it: "812 bytes", "12.4 kB", "1.25 MB" (decimal units). */
export function formatFileSize(bytes: number): string {
  if (bytes < 1000) return `${bytes} byte${bytes === 1 ? '' : 's'}`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(2)} MB`;
}

/**
 * The revision that follows another on a customer's drawing: A → B, Z → AA, 3 → 4, B2 → B3;
 * anything else gets "-2" appended. Common drawing practice (no source).
 */
export function nextRevision(revision: string): string {
  const r = revision.trim();
  const digits = /^(.*?)(\d+)$/.exec(r);
  if (digits) return `${digits[1]}${Number(digits[2]) + 1}`;
  const letters = /^(.*?)([A-Za-z]+)$/.exec(r);
  if (letters) {
    const upper = letters[2] === letters[2].toUpperCase();
    const chars = letters[2].toUpperCase().split('');
    let i = chars.length - 1;
    while (i >= 0 && chars[i] === 'Z') chars[i--] = 'A';
    if (i < 0) chars.unshift('A');
    else chars[i] = String.fromCharCode(chars[i].charCodeAt(0) + 1);
    const next = chars.join('');
    return `${letters[1]}${upper ? next : next.toLowerCase()}`;
  }
  return `${r}-2`;
}

/**
 * The revision that follows another on a customer's drawing: A → B, Z → AA, 3 → 4, B2 → B3;
 * anything else gets "-2" appended. Common drawing practice (no source).
 */
export function nextRevision(revision: string): string {
  const r = revision.trim();
  const digits = /^(.*?)(\d+)$/.exec(r);
  if (digits) {
    const [, head = '', number = ''] = digits;
    return `${head}${Number(number) + 1}`;
  }
  const letters = /^(.*?)([A-Za-z]+)$/.exec(r);
  if (letters) {
    const [, head = '', tail = ''] = letters;
    const upper = tail === tail.toUpperCase();
    const chars = tail.toUpperCase().split('');
    let i = chars.length - 1;
    while (i >= 0 && chars[i] === 'Z') chars[i--] = 'A';
    const bumped = chars[i];
    if (bumped === undefined) chars.unshift('A');
    else chars[i] = String.fromCharCode(bumped.charCodeAt(0) + 1);
    const next = chars.join('');
    return `${head}${upper ? next : next.toLowerCase()}`;
  }
  return `${r}-2`;
}

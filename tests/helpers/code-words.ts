/**
 * What code looks like when it leaks into text meant for people: a call (`wilsonInterval(`, any
 * word right against an opening bracket), a settings path, an arrow standing for "gives", or a
 * camelCase name. Used on the report's text in unit, integration and browser tests.
 */
const PATTERNS: [string, RegExp][] = [
  ['a call', /\w\(/],
  ['a camelCase call', /\b[a-z]+[A-Z]\w*\s*\(/],
  ['a settings path', /settings\./],
  ['an arrow', /→/],
  ['a camelCase name', /\b[a-z]+(?:[A-Z][a-z0-9]+)+\b/],
];

// Names people write that happen to look like camelCase.
const ALLOWED = /\beXtension\b/g;

/** Each code-looking piece of `text`, with a little of what surrounds it. */
export function codeWords(text: string): string[] {
  const plain = text.replace(ALLOWED, '');
  const found: string[] = [];
  for (const [what, pattern] of PATTERNS) {
    const m = pattern.exec(plain);
    if (m) found.push(`${what}: …${plain.slice(Math.max(0, m.index - 40), m.index + 40)}…`);
  }
  return found;
}

/** Every string inside a value (a report as JSON), so each can be checked. */
export function stringsIn(value: unknown, path = ''): { path: string; text: string }[] {
  if (typeof value === 'string') return [{ path, text: value }];
  if (Array.isArray(value)) return value.flatMap((v, i) => stringsIn(v, `${path}[${i}]`));
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => stringsIn(v, path ? `${path}.${k}` : k));
  return [];
}

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

describe('docs/library.md', () => {
  it('shows the example the suite runs (test/docs/libraryExample.test.ts), word for word', () => {
    const doc = readFileSync('docs/library.md', 'utf8');
    const example = readFileSync('test/docs/libraryExample.test.ts', 'utf8').split('\n').slice(1).join('\n').trimEnd();
    expect(doc).toContain('```ts\n' + example + '\n```');
  });
});

/**
 * Options whose value is optional (`--twirl [instances]`, `--fold [order]`) take the next
 * word as their value whatever it is, so `fray mitigate --twirl FILE` would read FILE as a
 * count. Such an option followed by a path (a word with a dot or a slash) that is not one of
 * its values is moved to the end of the arguments, where it stands alone: the path then keeps
 * its own meaning. Any other word stays the option's value, so a mistyped value still gets
 * the option's own message.
 */

/** Per command, the values each of its optional-value options accepts. */
const OPTIONAL_VALUES: ReadonlyMap<string, ReadonlyMap<string, RegExp>> = new Map([
  [
    'mitigate',
    new Map([
      ['--twirl', /^\d+$/],
      ['--fold', /^(end|random)$/],
    ]),
  ],
]);

/** A word that names a file rather than an option value. */
const PATH_LIKE = /[./\\]/;

/** `argv` with every optional-value option that is followed by something other than its value moved to the end. */
export function settleOptionalValues(argv: readonly string[]): string[] {
  const options = OPTIONAL_VALUES.get(argv[0] ?? '');
  if (options === undefined) return [...argv];
  const kept: string[] = [];
  const moved: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i]!;
    if (word === '--') {
      kept.push(...argv.slice(i));
      break;
    }
    const accepts = options.get(word);
    const next = argv[i + 1];
    if (accepts !== undefined && next !== undefined && !next.startsWith('-') && !accepts.test(next) && PATH_LIKE.test(next)) moved.push(word);
    else kept.push(word);
  }
  const end = kept.indexOf('--');
  if (end >= 0) kept.splice(end, 0, ...moved);
  else kept.push(...moved);
  return kept;
}

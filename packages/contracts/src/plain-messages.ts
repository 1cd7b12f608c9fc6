import { z } from 'zod';

/**
 * The product's own words for every problem a contract can find, used wherever a schema gives no
 * message of its own (a schema's `error` always wins). The validation library's default wording
 * ("Too small: expected number to be >=1") never reaches a user, and no message names a machine
 * path: the message sits beside the field, and the field's label says which one it is.
 */
type Issue = z.core.$ZodRawIssue;

/** What a client is told of a date that is not YYYY-MM-DD; the web says why in the practice's format instead. */
export const ISO_DATE_MESSAGE = 'Enter a date as YYYY-MM-DD';

const FORMATS: Record<string, string> = {
  email: 'Enter an e-mail address such as name@example.org',
  uuid: 'Choose an entry from the list',
  guid: 'Choose an entry from the list',
  date: ISO_DATE_MESSAGE,
  datetime: 'Enter a date and time',
  time: 'Enter a time as HH:MM',
  url: 'Enter a web address starting with https://',
};

const count = (n: number | bigint, one: string, many: string) => `${n} ${Number(n) === 1 ? one : many}`;

function sizeMessage(issue: Issue & { code: 'too_small' | 'too_big' }): string {
  const small = issue.code === 'too_small';
  const limit = small ? issue.minimum : issue.maximum;
  switch (issue.origin) {
    case 'string':
      if (small && Number(limit) <= 1) return 'This is required';
      return small
        ? `Enter at least ${count(limit, 'character', 'characters')}`
        : `At most ${count(limit, 'character', 'characters')}`;
    case 'array':
    case 'set':
      if (small && Number(limit) <= 1) return 'Add at least one';
      return small ? `Add at least ${limit}` : `At most ${limit} can be given`;
    case 'date':
      return small ? 'This date is too early' : 'This date is too late';
    default: {
      const exactly = issue.exact ? 'exactly ' : '';
      if (small) return issue.inclusive ? `Enter ${exactly}${limit} or more` : `Enter more than ${limit}`;
      return issue.inclusive ? `Enter ${exactly}${limit} or less` : `Enter less than ${limit}`;
    }
  }
}

function typeMessage(issue: Issue & { code: 'invalid_type' }): string {
  if (issue.input === undefined || issue.input === null) return 'This is required';
  switch (issue.expected) {
    case 'number':
    case 'int':
    case 'bigint':
      return 'Enter a number';
    case 'string':
      return 'Enter text';
    case 'boolean':
      return 'Choose yes or no';
    case 'date':
      return 'Enter a date';
    case 'array':
      return 'Give a list';
    default:
      return 'This value is not in a form the product accepts';
  }
}

/** The plain-language message for one issue, installed as zod's global error map in common.ts. */
export function plainMessage(issue: Issue): string {
  switch (issue.code) {
    case 'invalid_type':
      return typeMessage(issue);
    case 'too_small':
    case 'too_big':
      return sizeMessage(issue);
    case 'invalid_format':
      return FORMATS[issue.format] ?? 'This is not in the expected format';
    case 'invalid_value':
      return issue.values.length === 1 ? 'This value is not accepted here' : 'Choose one of the offered options';
    case 'not_multiple_of':
      return `Enter a multiple of ${String(issue.divisor)}`;
    case 'unrecognized_keys':
      return 'The form sent something this product does not accept; reload the page and try again';
    case 'invalid_union':
      return 'This value is not in a form the product accepts';
    case 'invalid_key':
    case 'invalid_element':
    case 'custom':
    default:
      return 'This value is not accepted';
  }
}

const LIBRARY_WORDING = [
  /^Invalid (input|option|string|number|key|value|discriminator|element)\b/,
  /^Too (big|small):/,
  /^Unrecognized keys?:/,
  /expected .+, received /,
  /must be a finite number/,
  /\(got /,
];
/** A dotted or bracketed path, or a camelCase identifier, in a sentence. */
const MACHINE_NAME = /\b[a-z]\w*\.(\d+|[a-z]\w*)\b|\[\d+\]|\b[a-z]+[A-Z]\w*\b/;

/**
 * What keeps a message from being plain words for a user (empty when it is plain): the library's
 * default wording, a machine path or an identifier. Tests apply it to every message they see.
 */
export function plainWordingProblems(message: string): string[] {
  const found = LIBRARY_WORDING.filter((re) => re.test(message)).map((re) => `library wording ${re}`);
  // An example address (name@example.org) is words for a user, not a path.
  if (MACHINE_NAME.test(message.replace(/\S+@\S+|\b(e\.g|i\.e)\./g, ''))) found.push('a machine name');
  return found;
}

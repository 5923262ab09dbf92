/**
 * A small tokeniser of the mathjs expression syntax, used only to locate problems in the text
 * (mathjs nodes carry no character positions). It never decides what is allowed: the allow-list
 * walk of the parsed tree in ./check.ts does.
 */

export type TokenKind = 'number' | 'name' | 'string' | 'op';

export interface Token {
  kind: TokenKind;
  text: string;
  /** 0-based character index of the first character. */
  pos: number;
}

const NUMBER = /^(?:0[xXbBoO][0-9a-fA-F]+|(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)/;
const NAME = /^[A-Za-z_$\u00C0-\u02AF\u0370-\u03FF\u2100-\u214F][\w$\u00C0-\u02AF\u0370-\u03FF\u2100-\u214F]*/;
const OPERATORS = ['>>>', '>>', '<<', '.*', './', '.^', "'", '==', '!=', '<=', '>=', '+=', '-=', '*=', '/=', '^='];

function endsValue(t: Token | undefined): boolean {
  return !!t && (t.kind === 'number' || t.kind === 'name' || t.kind === 'string' || t.text === ')' || t.text === ']' || t.text === "'");
}

/** Split `text` into tokens with their positions; whitespace is dropped, newlines kept as ops. */
export function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (ch === '\n' || ch === ';') {
      tokens.push({ kind: 'op', text: ch, pos: i });
      i += 1;
      continue;
    }
    if (/\s/.test(ch)) {
      i += 1;
      continue;
    }
    const rest = text.slice(i, i + 400);
    const prev = tokens[tokens.length - 1];
    if (ch === '"' || (ch === "'" && !endsValue(prev))) {
      let j = i + 1;
      while (j < text.length && text[j] !== ch) j += text[j] === '\\' ? 2 : 1;
      tokens.push({ kind: 'string', text: text.slice(i, j + 1), pos: i });
      i = j + 1;
      continue;
    }
    const num = NUMBER.exec(rest);
    if (num && /[\d.]/.test(ch) && !(ch === '.' && !/\d/.test(text[i + 1] ?? ''))) {
      tokens.push({ kind: 'number', text: num[0], pos: i });
      i += num[0].length;
      continue;
    }
    const name = NAME.exec(rest);
    if (name) {
      tokens.push({ kind: 'name', text: name[0], pos: i });
      i += name[0].length;
      continue;
    }
    const op = OPERATORS.find((o) => rest.startsWith(o)) ?? ch;
    tokens.push({ kind: 'op', text: op, pos: i });
    i += op.length;
  }
  return tokens;
}

/** True when token `i` is a name directly followed by "(" (a function call). */
export function isCall(tokens: Token[], i: number): boolean {
  return tokens[i]?.kind === 'name' && tokens[i + 1]?.text === '(';
}

export { endsValue };

/**
 * Typeset symbols and model equations in the certificate (pieces from ./equation.ts), in the
 * body font: the budget rows, the result headings and the annex's model lines use the same
 * {@link SymbolRun}, so a symbol reads alike wherever it is printed.
 */
import { Text, View, type Styles } from '@react-pdf/renderer';
import { typesetModel, type EquationPiece, type SymbolPiece } from './equation';
import { SANS } from './fonts';
import { palette, size } from './theme';

type Style = Styles[string];

/** Size of a subscript or an exponent, whatever the size of the text around it. */
const SCRIPT_SIZE = 5.8;

/** Raised, for an exponent: react-pdf does not pass verticalAlign on to nested runs, so each run carries it. */
const RAISED: Style = { fontSize: SCRIPT_SIZE, verticalAlign: 'super' };

/**
 * A quantity symbol: italic base (upright for a mathematical constant such as π), the subscript
 * lowered, upright when descriptive and italic when a one-letter index (ISO 80000-1 §7.1). In an
 * exponent (`raised`) the subscript stays at the exponent's height, in the same small size.
 */
export function SymbolRun({ piece, style, raised = false }: { piece: SymbolPiece; style?: Style; raised?: boolean }) {
  const subStyle: Style = raised ? RAISED : { fontSize: SCRIPT_SIZE, verticalAlign: 'sub' };
  return (
    <Text style={[{ fontFamily: SANS, fontStyle: piece.upright ? 'normal' : 'italic' }, raised ? RAISED : {}, style ?? {}]}>
      {piece.base}
      {piece.sub !== null ? <Text style={[{ fontStyle: piece.subUpright ? 'normal' : 'italic' }, subStyle]}>{piece.sub}</Text> : null}
    </Text>
  );
}

/** Pieces as inline runs of the surrounding text; an exponent's runs raised. */
export function PieceRuns({ pieces, raised = false }: { pieces: readonly EquationPiece[]; raised?: boolean }) {
  return (
    <>
      {pieces.map((p, i) => {
        if (p.kind === 'symbol') return <SymbolRun key={i} piece={p} raised={raised} />;
        if (p.kind === 'sup') return <PieceRuns key={i} pieces={p.pieces} raised />;
        return (
          <Text key={i} style={[{ fontStyle: 'normal' }, raised ? RAISED : {}]}>
            {p.text}
          </Text>
        );
      })}
    </>
  );
}

/**
 * textkit (react-pdf's layout) splits text into syllables at every change of style, so a symbol's
 * base and its subscript, or a Greek and a Latin letter, are a hyphenation point: "T-" at the end of
 * a line and "ref" on the next. A penalty of textkit's infinity (10 000, Knuth and Plass, "Breaking
 * paragraphs into lines", Software: Practice and Experience 11 (1981)) forbids those breaks; the
 * spaces after operators remain.
 */
const NO_BREAK_BETWEEN_RUNS = 10_000;

/** Continuation lines of a long equation are indented by this much (a hanging indent). */
const HANG = 12;

const styles = {
  block: { flexDirection: 'row', marginBottom: 3 },
  label: { width: 37, fontSize: size.small, color: palette.muted },
  // An equation's box is HANG wider than its first line (textkit measures the indented lines), which
  // leaves that much room after it: with the column gap, about 1.5 em between two equations.
  equations: { flex: 1, flexDirection: 'row', flexWrap: 'wrap', columnGap: 3, fontFamily: SANS, fontSize: size.table, lineHeight: 1.3 },
  equation: { maxWidth: '100%', paddingLeft: HANG },
  // textkit takes a paragraph's indent from its first run only, so the outdent goes on that run.
  firstRun: { textIndent: -HANG },
} satisfies Record<string, Style>;

/**
 * The model after "Model:", its equations separated by semicolons, as many on a line as fit (an
 * annex point is kept on one page, so the model takes no more lines than it needs). An equation
 * longer than the line breaks after an operator and goes on indented, as a broken displayed
 * equation does. An equation that is not "symbol = expression" prints as it was written.
 * `inputs`: the budget's identifiers (see typesetModel).
 */
export function ModelEquations({ equations, inputs }: { equations: readonly string[]; inputs: readonly string[] }) {
  const typeset = typesetModel(equations, inputs);
  return (
    <View style={styles.block}>
      <Text style={styles.label}>Model:</Text>
      <View style={styles.equations}>
        {equations.map((equation, i) => {
          const eq = typeset[i];
          const separator = i < equations.length - 1 ? ';' : '';
          if (!eq) {
            return (
              <Text key={i} style={styles.equation}>
                <Text style={styles.firstRun}>{`${equation}${separator}`}</Text>
              </Text>
            );
          }
          const [target, ...rest] = eq.left;
          return (
            <Text key={i} style={styles.equation} hyphenationPenalty={NO_BREAK_BETWEEN_RUNS}>
              <SymbolRun piece={target} style={styles.firstRun} />
              <PieceRuns pieces={rest} />
              <PieceRuns pieces={eq.right} />
              {separator}
            </Text>
          );
        })}
      </View>
    </View>
  );
}

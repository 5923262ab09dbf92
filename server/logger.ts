/** A minimal logger: one line per event on stdout/stderr. Tests pass `silentLogger`. */
export type Logger = {
  info(message: string, data?: Record<string, unknown>): void;
  warn(message: string, data?: Record<string, unknown>): void;
  error(message: string, data?: Record<string, unknown>): void;
};

const format = (level: string, message: string, data?: Record<string, unknown>) =>
  `${new Date().toISOString()} ${level} ${message}${data ? ' ' + JSON.stringify(data, errorReplacer) : ''}`;

function errorReplacer(_key: string, value: unknown) {
  return value instanceof Error ? { name: value.name, message: value.message, stack: value.stack } : value;
}

export const consoleLogger: Logger = {
  info: (m, d) => console.log(format('info', m, d)),
  warn: (m, d) => console.warn(format('warn', m, d)),
  error: (m, d) => console.error(format('error', m, d)),
};

export const silentLogger: Logger = { info: () => {}, warn: () => {}, error: () => {} };

/** A minimal logger: one line per event on stdout/stderr. Tests pass `silentLogger`. */
export type Logger = {
  info(message: string, data?: Record<string, unknown>): void;
  warn(message: string, data?: Record<string, unknown>): void;
  error(message: string, data?: Record<string, unknown>): void;
};

const format = (level: string, message: string, data?: Record<string, unknown>) =>
  `${new Date().toISOString()} ${level} ${message}${data ? ' ' + JSON.stringify(data, errorReplacer) : ''}`;

// Errors do not serialise by themselves; keep the cause (drizzle wraps the driver's error there).
function errorReplacer(_key: string, value: unknown) {
  if (!(value instanceof Error)) return value;
  const cause = (value as { cause?: unknown }).cause;
  const detail = (value as { detail?: unknown }).detail;
  return { name: value.name, message: value.message, ...(detail ? { detail } : {}), ...(cause ? { cause } : {}), stack: value.stack };
}

export const consoleLogger: Logger = {
  info: (m, d) => console.log(format('info', m, d)),
  warn: (m, d) => console.warn(format('warn', m, d)),
  error: (m, d) => console.error(format('error', m, d)),
};

export const silentLogger: Logger = { info: () => {}, warn: () => {}, error: () => {} };

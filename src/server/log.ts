// Structured logs: one JSON object per line, with a time, a level and an event name. Requests, security events
// and failures go here; stack traces go here and never to a client.

export type LogLevel = 'debug' | 'info' | 'warn' | 'error';

export interface Logger {
  log(level: LogLevel, event: string, fields?: Readonly<Record<string, unknown>>): void;
  info(event: string, fields?: Readonly<Record<string, unknown>>): void;
  warn(event: string, fields?: Readonly<Record<string, unknown>>): void;
  error(event: string, fields?: Readonly<Record<string, unknown>>): void;
}

export type LogSink = (line: string) => void;

const RANK: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40 };

export function createLogger(sink: LogSink, options: { level?: LogLevel; now?: () => Date } = {}): Logger {
  const min = RANK[options.level ?? 'info'];
  const now = options.now ?? (() => new Date());
  const log = (level: LogLevel, event: string, fields: Readonly<Record<string, unknown>> = {}): void => {
    if (RANK[level] < min) return;
    let line: string;
    try {
      line = JSON.stringify({ time: now().toISOString(), level, event, ...fields }, errorsAsObjects);
    } catch {
      line = JSON.stringify({ time: now().toISOString(), level, event, note: 'fields could not be written' });
    }
    sink(line + '\n');
  };
  return {
    log,
    info: (event, fields) => log('info', event, fields),
    warn: (event, fields) => log('warn', event, fields),
    error: (event, fields) => log('error', event, fields),
  };
}

function errorsAsObjects(_key: string, value: unknown): unknown {
  if (value instanceof Error) return { name: value.name, message: value.message, stack: value.stack };
  if (typeof value === 'bigint') return value.toString();
  return value;
}

/** A logger that keeps its lines, for tests. */
export function memoryLogger(): Logger & { readonly lines: Record<string, unknown>[] } {
  const lines: Record<string, unknown>[] = [];
  const logger = createLogger((line) => lines.push(JSON.parse(line) as Record<string, unknown>), {
    level: 'debug',
  });
  return Object.assign(logger, { lines });
}

/**
 * Typed errors of the store. A caller can tell, without reading message text, whether a
 * write broke a rule of the data (and which field), named something that is not there, met
 * a database from a newer Sealwork, or could not get the file.
 */

export type DbErrorKind =
  'notFound' | 'constraint' | 'foreignKey' | 'invalid' | 'newerVersion' | 'busy' | 'corrupt' | 'io';

export class DbError extends Error {
  override readonly name = 'DbError';
  readonly kind: DbErrorKind;
  /** The field at fault, as the caller named it (`clientId`, `measures[2].id`), if known. */
  readonly field: string | undefined;

  constructor(
    kind: DbErrorKind,
    message: string,
    options: { field?: string; cause?: unknown } = {},
  ) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.kind = kind;
    this.field = options.field;
  }
}

/** The SQLite result code of an error from better-sqlite3, or undefined. */
export function sqliteCode(error: unknown): string | undefined {
  if (error && typeof error === 'object' && 'code' in error) {
    const code = (error as { code: unknown }).code;
    if (typeof code === 'string' && code.startsWith('SQLITE_')) return code;
  }
  return undefined;
}

/**
 * Classifies a SQLite error by its result code (never by its message text).
 *
 * @param fields - the field each kind of constraint concerns in the operation that failed
 */
export function classifySqliteError(
  error: unknown,
  fields: { foreignKey?: string; unique?: string; check?: string; notNull?: string } = {},
): DbError | undefined {
  const code = sqliteCode(error);
  if (code === undefined) return undefined;
  const named = (field: string | undefined) => (field === undefined ? {} : { field });
  if (code === 'SQLITE_CONSTRAINT_FOREIGNKEY') {
    return new DbError('foreignKey', 'a linked record does not exist', {
      ...named(fields.foreignKey),
      cause: error,
    });
  }
  if (code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY') {
    return new DbError('constraint', 'that value is already used', {
      ...named(fields.unique),
      cause: error,
    });
  }
  if (code === 'SQLITE_CONSTRAINT_CHECK') {
    return new DbError('constraint', 'a value is outside what the store accepts', {
      ...named(fields.check),
      cause: error,
    });
  }
  if (code === 'SQLITE_CONSTRAINT_NOTNULL') {
    return new DbError('constraint', 'a required value is missing', {
      ...named(fields.notNull),
      cause: error,
    });
  }
  if (code.startsWith('SQLITE_CONSTRAINT')) {
    return new DbError('constraint', 'a rule of the data was broken', { cause: error });
  }
  if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')) {
    return new DbError('busy', 'the project file is busy in another window or program; try again', {
      cause: error,
    });
  }
  if (code.startsWith('SQLITE_CORRUPT') || code === 'SQLITE_NOTADB') {
    return new DbError('corrupt', 'the file is not a Sealwork project or is damaged', {
      cause: error,
    });
  }
  if (
    code.startsWith('SQLITE_CANTOPEN') ||
    code.startsWith('SQLITE_IOERR') ||
    code === 'SQLITE_READONLY'
  ) {
    return new DbError('io', 'the project file cannot be opened or written', { cause: error });
  }
  return undefined;
}

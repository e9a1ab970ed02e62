// Types for the part of better-sqlite3 (12.x, CommonJS, no bundled types) that the flight catalogue uses.
// Written from the package's API documentation (docs/api.md); only what flightCatalogue.ts calls.

declare module 'better-sqlite3' {
  namespace Database {
    type BindValue = number | string | bigint | Buffer | null;
    interface RunResult {
      changes: number;
      lastInsertRowid: number | bigint;
    }
    interface Statement {
      run(...params: (BindValue | Record<string, BindValue>)[]): RunResult;
      get(...params: (BindValue | Record<string, BindValue>)[]): unknown;
      all(...params: (BindValue | Record<string, BindValue>)[]): unknown[];
    }
    interface Options {
      readonly?: boolean;
      fileMustExist?: boolean;
      /** Milliseconds to wait on a locked database before SQLITE_BUSY (the busy timeout); default 5000. */
      timeout?: number;
    }
    interface Database {
      prepare(sql: string): Statement;
      exec(sql: string): Database;
      pragma(source: string, options?: { simple?: boolean }): unknown;
      transaction<F extends (...args: never[]) => unknown>(fn: F): F;
      close(): Database;
      readonly open: boolean;
      readonly inTransaction: boolean;
    }
  }
  interface DatabaseConstructor {
    new (filename: string, options?: Database.Options): Database.Database;
  }
  const Database: DatabaseConstructor;
  export = Database;
}

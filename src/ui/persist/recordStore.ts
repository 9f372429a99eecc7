/**
 * Append-only storage of workspace snapshots. Records are only ever added, and removed only after a
 * newer one was written successfully, so a failed save never costs an older one.
 * IndexedDB implements it in the page (indexedDbStore.ts); an in-memory store serves the tests.
 */

export interface StoredRecord<T> {
  /** Increasing with every append (IndexedDB's auto-increment key). */
  key: number;
  value: T;
}

export interface RecordStore<T> {
  /** Adds `value` in its own transaction; resolves with its key once the transaction has committed. */
  append(value: T): Promise<number>;
  /** Every record, oldest first. */
  readAll(): Promise<StoredRecord<T>[]>;
  /** Removes the records with these keys (one transaction). */
  remove(keys: readonly number[]): Promise<void>;
}

/** In-memory RecordStore; `failNextAppends` makes the next appends fail as a full disk would. */
export class MemoryRecordStore<T> implements RecordStore<T> {
  private records: StoredRecord<T>[] = [];
  private nextKey = 1;
  failNextAppends = 0;
  failureMessage = 'QuotaExceededError: the storage quota has been exceeded';

  append(value: T): Promise<number> {
    if (this.failNextAppends > 0) {
      this.failNextAppends -= 1;
      return Promise.reject(new Error(this.failureMessage));
    }
    const key = this.nextKey++;
    this.records.push({ key, value: structuredClone(value) });
    return Promise.resolve(key);
  }

  readAll(): Promise<StoredRecord<T>[]> {
    return Promise.resolve(this.records.map((record) => structuredClone(record)));
  }

  remove(keys: readonly number[]): Promise<void> {
    this.records = this.records.filter((record) => !keys.includes(record.key));
    return Promise.resolve();
  }

  get size(): number {
    return this.records.length;
  }
}

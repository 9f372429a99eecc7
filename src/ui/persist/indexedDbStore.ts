/**
 * RecordStore over IndexedDB: one object store with auto-increment keys. Each call is one
 * transaction; a promise resolves on the transaction's `complete` (committed), and rejects on
 * `error` or `abort` with the browser's reason.
 */
import type { RecordStore, StoredRecord } from './recordStore';

const STORE_NAME = 'snapshots';
const DB_VERSION = 1;

function describe(error: DOMException | null | undefined, fallback: string): Error {
  return new Error(error ? `${error.name}: ${error.message}` : fallback);
}

function openDatabase(dbName: string): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    if (typeof indexedDB === 'undefined') {
      reject(new Error('This browser offers no IndexedDB (private window or storage disabled).'));
      return;
    }
    const request = indexedDB.open(dbName, DB_VERSION);
    request.onupgradeneeded = () => {
      if (!request.result.objectStoreNames.contains(STORE_NAME)) {
        request.result.createObjectStore(STORE_NAME, { autoIncrement: true });
      }
    };
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(describe(request.error, 'IndexedDB could not be opened.'));
    request.onblocked = () => reject(new Error('IndexedDB is blocked by another tab of this page; close it and reload.'));
  });
}

function inTransaction<R>(db: IDBDatabase, mode: IDBTransactionMode, work: (store: IDBObjectStore) => IDBRequest | null, read: (request: IDBRequest | null) => R): Promise<R> {
  return new Promise((resolve, reject) => {
    let transaction: IDBTransaction;
    try {
      transaction = db.transaction(STORE_NAME, mode);
    } catch (error) {
      reject(error instanceof Error ? error : new Error(String(error)));
      return;
    }
    const request = work(transaction.objectStore(STORE_NAME));
    transaction.oncomplete = () => resolve(read(request));
    transaction.onerror = () => reject(describe(transaction.error ?? request?.error, 'The IndexedDB transaction failed.'));
    transaction.onabort = () => reject(describe(transaction.error, 'The IndexedDB transaction was aborted.'));
  });
}

export function createIndexedDbStore<T>(dbName: string): RecordStore<T> {
  let dbPromise: Promise<IDBDatabase> | null = null;
  const db = () => {
    dbPromise ??= openDatabase(dbName);
    dbPromise.catch(() => {
      dbPromise = null;
    });
    return dbPromise;
  };
  return {
    append: async (value) =>
      inTransaction(await db(), 'readwrite', (store) => store.add(value), (request) => Number(request?.result)),
    readAll: async () => {
      const database = await db();
      let keys: IDBValidKey[] = [];
      const values = await inTransaction(
        database,
        'readonly',
        (store) => {
          const keyRequest = store.getAllKeys();
          keyRequest.onsuccess = () => {
            keys = keyRequest.result;
          };
          return store.getAll();
        },
        (request) => (request?.result ?? []) as T[],
      );
      return values.map((value, i): StoredRecord<T> => ({ key: Number(keys[i]), value }));
    },
    remove: async (keys) =>
      inTransaction(
        await db(),
        'readwrite',
        (store) => {
          for (const key of keys) store.delete(key);
          return null;
        },
        () => undefined,
      ),
  };
}

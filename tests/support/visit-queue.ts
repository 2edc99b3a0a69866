// The phone's queue of visits waiting to send (IndexedDB, database "tightloop-visits", store "queue"), read and
// written from the page as a test needs to replay one.
import type { Page } from 'playwright-core';

type Stored = { key: string; value: unknown[] };

export function readVisitQueue(page: Page): Promise<Stored> {
  return page.evaluate(
    () =>
      new Promise<Stored>((resolve, reject) => {
        const open = indexedDB.open('tightloop-visits');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const req = open.result.transaction('queue').objectStore('queue').openCursor();
          req.onerror = () => reject(req.error);
          req.onsuccess = () => {
            const cursor = req.result;
            open.result.close();
            resolve(cursor ? { key: String(cursor.key), value: cursor.value as unknown[] } : { key: '', value: [] });
          };
        };
      }),
  );
}

export function writeVisitQueue(page: Page, stored: Stored): Promise<void> {
  return page.evaluate(
    ({ key, value }) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open('tightloop-visits');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const tx = open.result.transaction('queue', 'readwrite');
          tx.objectStore('queue').put(value, key);
          tx.oncomplete = () => {
            open.result.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
    stored,
  );
}

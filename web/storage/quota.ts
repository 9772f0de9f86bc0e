export interface StorageStatus {
  usedBytes: number | null;
  quotaBytes: number | null;
  persisted: boolean;
}

/** Share of the quota above which the app warns that space is running out. */
export const QUOTA_WARNING = 0.8;

export async function storageStatus(): Promise<StorageStatus> {
  const s = navigator.storage;
  if (!s?.estimate) return { usedBytes: null, quotaBytes: null, persisted: false };
  const [estimate, persisted] = await Promise.all([s.estimate(), s.persisted?.() ?? false]);
  return { usedBytes: estimate.usage ?? null, quotaBytes: estimate.quota ?? null, persisted };
}

/** Asks the browser not to evict the app's data under storage pressure; resolves to the answer. */
export async function requestPersistence(): Promise<boolean> {
  return (await navigator.storage?.persist?.()) ?? false;
}

export function formatBytes(n: number): string {
  if (n < 1024 * 1024) return `${Math.round(n / 1024)} kB`;
  if (n < 1024 ** 3) return `${(n / 1024 / 1024).toFixed(1)} MB`;
  return `${(n / 1024 ** 3).toFixed(2)} GB`;
}

/** Share of the quota a new photo may not push the usage past. */
const QUOTA_LIMIT = 0.95;

/**
 * Throws an Error naming the file when storing `bytes` more would take the device past 95 % of
 * the quota, so a photo is refused with a message rather than failing half-written.
 */
export async function ensureRoomFor(bytes: number, name: string): Promise<void> {
  const s = await storageStatus();
  if (s.usedBytes === null || !s.quotaBytes) return;
  if (s.usedBytes + bytes > s.quotaBytes * QUOTA_LIMIT)
    throw new Error(
      `${name} (${formatBytes(bytes)}) does not fit: ${formatBytes(s.usedBytes)} of ${formatBytes(s.quotaBytes)} are used. Export a backup and remove old experiments first.`,
    );
}

/**
 * InnoDB breaks a deadlock (or gives up a lock wait) by rolling one transaction back; the
 * documented remedy is to run that transaction again (MariaDB Knowledge Base, "InnoDB Lock
 * Modes" / deadlocks). `run` must start a fresh transaction on every call.
 */
export const DEADLOCK = /deadlock|lock wait timeout/i;

export async function retryOnDeadlock<T>(run: () => Promise<T>, attempts = 4): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await run();
    } catch (error) {
      if (attempt < attempts && error instanceof Error && DEADLOCK.test(error.message)) continue;
      throw error;
    }
  }
}

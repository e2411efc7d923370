// PLACEHOLDER — replaced by the outbox worker (notices issue).
export function startOutboxWorker(): void {}

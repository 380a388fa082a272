/** Record ids (jobs, designs, machine profiles…) are UUIDs: anything else names no record. */
export function isRecordId(id: string): boolean {
  return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id);
}

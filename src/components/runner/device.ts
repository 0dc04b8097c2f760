/** A short, stable name for this browser, stored with every event it records ("Tablet 3f2a"). */
let cached: string | null = null;

export function deviceName(): string {
  if (cached) return cached;
  let id = '';
  try {
    id = localStorage.getItem('tt-device-id') ?? '';
    if (!id) {
      id = crypto.randomUUID().slice(0, 4);
      localStorage.setItem('tt-device-id', id);
    }
  } catch {
    id = crypto.randomUUID().slice(0, 4);
  }
  const touch = typeof matchMedia === 'function' && matchMedia('(pointer: coarse)').matches;
  const kind = touch ? (Math.min(screen.width, screen.height) < 600 ? 'Phone' : 'Tablet') : 'Computer';
  cached = `${kind} ${id}`;
  return cached;
}

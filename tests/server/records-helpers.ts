// Sending bench records in tests: a photo with a location in it, and a multipart POST.
import sharp from 'sharp';
import type { TestServer } from './harness.ts';

/** A small JPEG carrying camera and GPS EXIF, as a phone writes it. */
export async function photoWithLocation(): Promise<Buffer> {
  return sharp({ create: { width: 640, height: 480, channels: 3, background: '#c8a060' } })
    .withExif({
      IFD0: { Make: 'TestCam', Model: 'Bench 1', Software: 'camera firmware 1.0' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '50/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '4/1 10/1 0/1' },
    })
    .jpeg()
    .toBuffer();
}

export interface Part {
  name: string;
  value: string | Buffer;
  filename?: string;
  type?: string;
}

export async function postRecord(t: TestServer, cookie: string, date: string, parts: Part[], headers: Record<string, string> = {}) {
  const form = new FormData();
  for (const p of parts) {
    if (typeof p.value === 'string' && p.filename === undefined) form.append(p.name, p.value);
    else form.append(p.name, new Blob([typeof p.value === 'string' ? p.value : new Uint8Array(p.value)], { type: p.type ?? 'application/octet-stream' }), p.filename ?? 'file');
  }
  const res = await fetch(`${t.url}/api/plans/${date}/records`, { method: 'POST', headers: { cookie, ...headers }, body: form });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, res };
}


'use client';

import { useState } from 'react';

async function sha256Hex(buf: ArrayBuffer): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', buf);
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/** Hashes the dropped PDF in the browser (the file never leaves the machine) and compares it with the issued hash. */
export function VerifyDrop({ expected }: { expected: string }) {
  const [result, setResult] = useState<{ name: string; hash: string; ok: boolean } | null>(null);
  const [over, setOver] = useState(false);

  async function check(file: File | undefined) {
    if (!file) return;
    const hash = await sha256Hex(await file.arrayBuffer());
    setResult({ name: file.name, hash, ok: hash === expected });
  }

  return (
    <div>
      <label
        htmlFor="verify-file"
        onDragOver={(e) => { e.preventDefault(); setOver(true); }}
        onDragLeave={() => setOver(false)}
        onDrop={(e) => { e.preventDefault(); setOver(false); void check(e.dataTransfer.files[0]); }}
        className={`flex cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed p-8 text-center ${over ? 'border-brass bg-brass-soft/40' : 'border-rule bg-white'}`}
      >
        <span className="font-semibold">Drop the report PDF here, or choose it</span>
        <span className="mt-1 text-sm text-ink-soft">The file is checked in your browser and is not uploaded.</span>
        <input id="verify-file" type="file" accept="application/pdf,.pdf" className="sr-only" onChange={(e) => void check(e.target.files?.[0])} />
      </label>
      {result && (
        <div role="status" data-testid="verify-result" className={`mt-4 rounded-md border p-4 ${result.ok ? 'border-status-pass/50 bg-status-pass/10' : 'border-status-fail/50 bg-status-fail/10'}`}>
          <p className="font-semibold">{result.ok ? 'Genuine: this is the file NookPass issued under this code.' : 'Not the issued file: it differs from what NookPass issued under this code.'}</p>
          <p className="mt-1 break-all font-mono text-xs">{result.name}: {result.hash}</p>
        </div>
      )}
    </div>
  );
}

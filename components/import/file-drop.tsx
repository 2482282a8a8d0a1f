'use client';
import { useState } from 'react';
import { count } from '@/lib/format';
import { MAX_CELL_CHARS } from '@/lib/import/errors';

/** A drop zone that is also a file input (keyboard and screen-reader friendly). */
export function FileDrop({ onFile, disabled }: { onFile: (file: File) => void; disabled?: boolean }) {
  const [over, setOver] = useState(false);
  return (
    <label
      onDragOver={(e) => {
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        const file = e.dataTransfer.files[0];
        if (file && !disabled) onFile(file);
      }}
      className={`flex cursor-pointer flex-col items-center justify-center gap-1 rounded-lg border-2 border-dashed px-6 py-8 text-center text-sm focus-within:ring-2 focus-within:ring-accent ${
        over ? 'border-accent bg-accent-soft' : 'border-rule-strong bg-panel/60'
      }`}
    >
      <span className="font-medium text-ink">Drop a CSV file here, or choose one</span>
      <span className="text-xs text-ink-muted">UTF-8 · comma, semicolon or tab · cells up to {count(MAX_CELL_CHARS)} characters · parsed in your browser first</span>
      <input
        type="file"
        accept=".csv,.tsv,.txt,text/csv,text/tab-separated-values"
        className="sr-only"
        aria-label="CSV file to import"
        disabled={disabled}
        onChange={(e) => {
          const file = e.target.files?.[0];
          if (file) onFile(file);
          e.target.value = '';
        }}
      />
    </label>
  );
}

import type { DragEvent, ReactNode } from 'react';
import { useRef, useState } from 'react';
import { cn } from './cn';
import { errorMessage, useFieldIds, type FieldErrorLike } from './field-utils';
import { fileKey, mergeFiles, type FileRejection } from './file-accept';
import { Icon } from './Icon';
import { IconButton } from './IconButton';
import { errorTextClass, hintClass, labelClass } from './styles';
import { formatCount, formatFileSize } from '@shared/format';

export interface DropZoneProps {
  /** Visible label, e.g. "Run files". */
  label: ReactNode;
  /** Help under the label, e.g. "CSV exports from the dyno PC, up to 50 at once". */
  hint?: ReactNode;
  /** Accepted extensions and MIME types, e.g. ['.csv', '.txt']. */
  accept?: readonly string[];
  /** Allow several files; default true. */
  multiple?: boolean;
  maxFiles?: number;
  maxSizeBytes?: number;
  /** The chosen files (controlled). */
  files: readonly File[];
  onFilesChange: (files: File[]) => void;
  /** Files that were skipped, with the reason. A short summary is also shown in the zone. */
  onReject?: (rejections: FileRejection[]) => void;
  /** Extra per-file content in the list, e.g. upload progress or a StatusBadge. */
  renderFileStatus?: (file: File) => ReactNode;
  /** Hide the list of chosen files (if the caller shows its own). */
  hideFileList?: boolean;
  error?: FieldErrorLike;
  disabled?: boolean;
  id?: string;
  className?: string;
}

const reasonText: Record<FileRejection['reason'], string> = {
  type: 'not an accepted type',
  size: 'too large',
  count: 'over the file limit',
};

/**
 * Drag files onto the zone, or click / tap / press Enter or Space on it to open the file picker.
 * The real file input sits inside the zone (visually hidden), so keyboard and screen-reader
 * users get the browser's own file control.
 */
export function DropZone({
  label,
  hint,
  accept,
  multiple = true,
  maxFiles,
  maxSizeBytes,
  files,
  onFilesChange,
  onReject,
  renderFileStatus,
  hideFileList = false,
  error,
  disabled = false,
  id,
  className,
}: DropZoneProps) {
  const f = useFieldIds({ id, hint, error });
  const [dragDepth, setDragDepth] = useState(0);
  const [skipped, setSkipped] = useState<FileRejection[]>([]);
  const inputRef = useRef<HTMLInputElement>(null);
  const dragging = dragDepth > 0 && !disabled;

  const take = (incoming: File[]) => {
    if (disabled || incoming.length === 0) return;
    const result = mergeFiles(files, incoming, { accept, multiple, maxFiles, maxSizeBytes });
    setSkipped(result.rejected);
    if (result.rejected.length > 0) onReject?.(result.rejected);
    onFilesChange(result.files);
  };

  const onDrop = (event: DragEvent<HTMLLabelElement>) => {
    event.preventDefault();
    setDragDepth(0);
    take(Array.from(event.dataTransfer.files));
  };

  const acceptText = accept && accept.length > 0 ? accept.join(', ') : null;

  return (
    <div className={cn('flex flex-col', className)}>
      <span className={cn(labelClass, 'mb-1.5')} aria-hidden="true">
        {label}
      </span>
      {hint && (
        <p id={f.hintId} className={cn(hintClass, 'mt-0 mb-1.5')}>
          {hint}
        </p>
      )}
      <label
        htmlFor={f.controlId}
        onDragEnter={(event) => {
          event.preventDefault();
          setDragDepth((d) => d + 1);
        }}
        onDragOver={(event) => {
          event.preventDefault();
          event.dataTransfer.dropEffect = disabled ? 'none' : 'copy';
        }}
        onDragLeave={() => setDragDepth((d) => Math.max(0, d - 1))}
        onDrop={onDrop}
        className={cn(
          'relative flex min-h-36 cursor-pointer flex-col items-center justify-center gap-2 rounded-card border-2 border-dashed px-4 py-6 text-center transition-colors',
          'has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-focus',
          dragging ? 'border-accent bg-accent-soft' : 'border-line-strong bg-paper-raised hover:bg-paper-sunk',
          f.message && 'border-loss',
          disabled && 'cursor-not-allowed opacity-60 hover:bg-paper-raised',
        )}
      >
        <input
          ref={inputRef}
          type="file"
          className="sr-only"
          multiple={multiple}
          accept={accept?.join(',')}
          disabled={disabled}
          onChange={(event) => {
            take(Array.from(event.target.files ?? []));
            // Clear so choosing the same file again still fires a change.
            event.target.value = '';
          }}
          {...f.controlProps}
        />
        <Icon name="upload" size={28} className={dragging ? 'text-accent' : 'text-ink-subtle'} />
        <span className="text-base text-ink">
          <span className="sr-only">{label}. </span>
          {dragging ? (
            'Drop to add'
          ) : (
            <>
              Drag {multiple ? 'files' : 'a file'} here, or{' '}
              <span className="font-semibold text-accent underline underline-offset-2">choose {multiple ? 'files' : 'a file'}</span>
            </>
          )}
        </span>
        {(acceptText || maxSizeBytes !== undefined || maxFiles !== undefined) && (
          <span className="text-sm text-ink-subtle">
            {[
              acceptText && `Accepts ${acceptText}`,
              maxSizeBytes !== undefined && `up to ${formatFileSize(maxSizeBytes)} each`,
              maxFiles !== undefined && `at most ${formatCount(maxFiles, 'file')}`,
            ]
              .filter(Boolean)
              .join(' · ')}
          </span>
        )}
      </label>

      {f.message && (
        <p id={f.errorId} className={errorTextClass}>
          <Icon name="triangle" size={16} className="mt-0.5" />
          <span>{errorMessage(error)}</span>
        </p>
      )}

      <div aria-live="polite" className="mt-2 text-sm">
        {skipped.length > 0 && (
          <p className="flex items-start gap-1 font-medium text-warn">
            <Icon name="triangle" size={16} className="mt-0.5" />
            <span>
              Skipped {formatCount(skipped.length, 'file')}:{' '}
              {skipped.map((s) => `${s.file.name} (${reasonText[s.reason]})`).join(', ')}
            </span>
          </p>
        )}
        {!hideFileList && files.length > 0 && <p className="sr-only">{formatCount(files.length, 'file')} chosen</p>}
      </div>

      {!hideFileList && files.length > 0 && (
        <div className="mt-1">
          <div className="mb-1 flex items-center justify-between text-sm text-ink-muted">
            <span className="num">{formatCount(files.length, 'file')} chosen</span>
            {!disabled && (
              <button
                type="button"
                className="min-h-11 px-2 font-semibold text-accent hover:text-accent-hover"
                onClick={() => {
                  onFilesChange([]);
                  setSkipped([]);
                  inputRef.current?.focus();
                }}
              >
                Remove all
              </button>
            )}
          </div>
          <ul aria-label="Chosen files" className="divide-y divide-line rounded-card border border-line bg-paper-raised">
            {files.map((file) => (
              <li key={fileKey(file)} className="flex items-center gap-3 px-3 py-1.5">
                <Icon name="file" size={18} className="text-ink-subtle" />
                <span className="min-w-0 flex-1 truncate text-ink" title={file.name}>
                  {file.name}
                </span>
                <span className="num shrink-0 text-sm text-ink-subtle">{formatFileSize(file.size)}</span>
                {renderFileStatus?.(file)}
                {!disabled && (
                  <IconButton
                    label={`Remove ${file.name}`}
                    size="sm"
                    icon={<Icon name="x" size={18} />}
                    onClick={() => onFilesChange(files.filter((other) => other !== file))}
                  />
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}

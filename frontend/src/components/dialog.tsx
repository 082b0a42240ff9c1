import { useEffect, useId, useRef, type ReactNode } from 'react';

/**
 * A modal dialog on the native <dialog> element. `showModal()` gives what a modal needs without
 * code of ours: the rest of the page becomes inert (focus stays inside), Escape closes it (the
 * `cancel` event), and it sits in the top layer. On close, focus returns to the control that
 * opened it. The content is mounted only while open, so a form inside starts fresh every time.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  wide = false,
}: {
  open: boolean;
  /** Called when the dialog closes by Escape or by a close button; the owner sets `open` false. */
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children: ReactNode;
  wide?: boolean;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const opener = useRef<Element | null>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      opener.current = document.activeElement;
      dialog.showModal();
      // showModal focuses the first focusable element, which is the close button; start in the
      // first field instead so typing can begin at once.
      dialog.querySelector<HTMLElement>('[data-autofocus], input:not([type=hidden]), select, textarea')?.focus();
    } else if (!open && dialog.open) {
      dialog.close();
    }
  }, [open]);

  // Closing unmounts the content; give focus back to the opener if it is still on the page.
  useEffect(() => {
    if (open) return;
    const target = opener.current;
    opener.current = null;
    if (target instanceof HTMLElement && target.isConnected) target.focus();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onClose={() => {
        if (open) onClose();
      }}
      className={`m-auto w-[calc(100%-2rem)] rounded-md border border-slate-300 bg-white p-0 text-slate-900 shadow-xl backdrop:bg-slate-900/40 ${wide ? 'max-w-2xl' : 'max-w-lg'}`}
    >
      {open && (
        <div className="px-5 py-4">
          <div className="mb-3 flex items-start justify-between gap-4">
            <div>
              <h2 id={titleId} className="text-base">
                {title}
              </h2>
              {description && (
                <div id={descriptionId} className="mt-0.5 text-sm text-slate-600">
                  {description}
                </div>
              )}
            </div>
            <button
              type="button"
              onClick={onClose}
              className="-mt-1 -mr-2 rounded px-2 py-1 text-lg leading-none text-slate-500 hover:bg-slate-100 hover:text-slate-900"
              aria-label="Close"
            >
              ×
            </button>
          </div>
          {children}
        </div>
      )}
    </dialog>
  );
}

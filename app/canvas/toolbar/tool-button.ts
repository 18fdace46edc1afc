// The look of a toolbar button, shared by the toolbar's pieces.
export const toolButton = "rounded px-2 py-1 text-sm font-medium text-ink-700 hover:bg-ink-100 disabled:cursor-not-allowed disabled:text-ink-300";

/**
 * Keys of the board on a keyboard: Left / Right page the cards, Escape stops following. On
 * native there is no hardware keyboard to listen to; the web version is use-board-keys.web.ts.
 */
export function useBoardKeys(_handlers: { onLeft?: () => void; onRight?: () => void; onEscape?: () => void }) {}

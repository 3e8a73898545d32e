/** Native screens have no document title. */
export function useDocumentTitle(_title: string | undefined) {}

// Addresses of a package's download, shared by the API's views and the pages (no server code here).
export const packageDownloadUrl = (id: string) => `/api/evidence-packages/${id}/download`;

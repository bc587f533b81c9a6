// URLs of the media route, shared by pages and the worker. A recording's derived files sit in one URL
// folder, so the relative sprite URL inside its WebVTT thumbnail track resolves through the same route.
export const recordingFileUrl = (recordingId: string, file: string) => `/api/media/recordings/${recordingId}/${encodeURIComponent(file)}`;
export const stillUrl = (stillId: string) => `/api/media/stills/${stillId}`;
export const reportDownloadUrl = (reportId: string) => `/api/reports/${reportId}/download`;

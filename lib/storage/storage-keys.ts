// Every key of the store, built here and nowhere else. A key is a relative path below the storage
// folder (lib/storage/disk-store.ts turns it into a file path, lib/storage/s3-store.ts into an object name), made of ids only, never of a file
// name a user typed, so it cannot leave the store or collide with another organisation's files.
//
//   originals/<org>/<first 2 characters of the recording id>/<recording id>   write-once originals
//   derived/<org>/<recording id>/<file>                                       renditions, replaced as a folder
//   stills/<org>/<recording id>/<still id>.jpg                                 frame stills (survive reprocessing)
//   reports/<org>/<job id>/<report id>.pdf                                     built report PDFs
//   tracks/<org>/<track id>                                                   write-once flight tracks (lib/tracks)
//   packages/<org>/<package id>.zip                                            evidence packages (lib/evidence-packages)

/** Refuses anything that is not a key of the store (an absolute path, "..", an empty part) before it is used. */
export function assertStoreKey(key: string): void {
  if (!key || key.startsWith("/") || key.includes("\\") || key.split("/").some((part) => part === "" || part === "." || part === "..")) {
    throw new Error("key outside the store");
  }
}

/** The folder of the originals, for the purge that lists it. */
export const ORIGINALS_FOLDER = "originals";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
function assertIds(...ids: string[]) {
  for (const id of ids) if (!UUID.test(id)) throw new Error(`not an id: ${id}`);
}

export function originalKey(organisationId: string, recordingId: string): string {
  assertIds(organisationId, recordingId);
  // two-character shards keep one folder from holding every original of an organisation
  return `${ORIGINALS_FOLDER}/${organisationId}/${recordingId.slice(0, 2)}/${recordingId}`;
}

/** The folder of one recording's derived files (the worker replaces it as a whole). */
export function derivedFolderKey(organisationId: string, recordingId: string): string {
  assertIds(organisationId, recordingId);
  return `derived/${organisationId}/${recordingId}`;
}

export function derivedKey(organisationId: string, recordingId: string, file: string): string {
  if (!/^[a-z0-9._-]+$/i.test(file) || file.includes("..")) throw new Error(`bad derived file name: ${file}`);
  return `${derivedFolderKey(organisationId, recordingId)}/${file}`;
}

export function stillKey(organisationId: string, recordingId: string, stillId: string): string {
  assertIds(organisationId, recordingId, stillId);
  // outside the recording's derived folder: reprocessing replaces that folder, stills must survive it
  return `stills/${organisationId}/${recordingId}/${stillId}.jpg`;
}

export function reportKey(organisationId: string, jobId: string, reportId: string): string {
  assertIds(organisationId, jobId, reportId);
  return `reports/${organisationId}/${jobId}/${reportId}.pdf`;
}

export function evidencePackageKey(organisationId: string, packageId: string): string {
  assertIds(organisationId, packageId);
  return `packages/${organisationId}/${packageId}.zip`;
}

/** A flight track's write-once file (GPX or CSV as imported), beside the originals but never among them. */
export function trackKey(organisationId: string, trackId: string): string {
  assertIds(organisationId, trackId);
  return `tracks/${organisationId}/${trackId}`;
}

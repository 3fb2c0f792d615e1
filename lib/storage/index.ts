/** Content-addressed file storage and upload reading: no database, no domain rules. */
export { readBodyBytes } from "./body";
export { checkReportFileType, fileKinds, sniffContent, type FileKind, type SniffedType, type TypeCheck } from "./file-type";
export {
  readStored,
  removeStored,
  sha256Hex,
  storeBytes,
  storeDerived,
  storedExists,
  storedPath,
  uploadRoot,
  type StoredFile,
} from "./file-store";
export { parseMultipart, requireMultipart, singleFile, type MultipartBody, type UploadedPart } from "./multipart";
export { readTextUpload } from "./text-upload";

/** A detector site code: one to four characters, an uppercase letter first, then uppercase letters or digits. */
export const detectorCodePattern = /^[A-Z][A-Z0-9]{0,3}$/;

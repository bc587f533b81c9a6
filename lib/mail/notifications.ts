export { notifyProcessingFinished } from "./notify-processing-finished";
export { notifyReportApproved } from "./notify-report-approved";
export { mailShareLink } from "./mail-share-link";

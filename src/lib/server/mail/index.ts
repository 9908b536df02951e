export { queueMail, type OutgoingMail } from './queue';
export { appLink } from './config';

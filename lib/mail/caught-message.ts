/** One message as the local SMTP catcher stores and lists it. */
export interface CaughtMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

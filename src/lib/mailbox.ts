/** A message as the local SMTP stand-in keeps it and its reader serves it as JSON. */
export interface CapturedMessage {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
	attachments: { filename: string; contentType: string; size: number; base64: string }[];
}

import { pdfResponse } from './http';

/** A stored revision's packet as a PDF answer: the bytes as submitted, with their sha256 in a header. */
export function storedPacketResponse(
	packet: { number: number; bytes: Uint8Array; sha256: string; name: string },
	url: URL,
): Response {
	const res = pdfResponse(packet.bytes, `permit-packet-${packet.name}-rev-${packet.number}.pdf`, url);
	res.headers.set('X-Content-SHA256', packet.sha256);
	return res;
}

import { StringDecoder } from 'node:string_decoder';
import { setImmediate } from 'node:timers/promises';
import { SaxesParser, type SaxesTagPlain } from 'saxes';

/** What a part's reader does with the XML events; names come without their prefix. */
export interface XmlHandler {
	open(name: string, attributes: Record<string, string>): void;
	close(name: string): void;
	text(text: string): void;
}

export class XmlSyntaxError extends Error {
	constructor(
		message: string,
		readonly line: number
	) {
		super(message);
		this.name = 'XmlSyntaxError';
	}
}

const localName = (name: string) => name.slice(name.indexOf(':') + 1);

/** Work between two turns of the event loop (other requests wait no longer than this). */
const SLICE_MS = 4;

/**
 * Parses XML strictly (saxes: well-formedness errors are errors, never skipped) as it streams,
 * handing each event to `handler`. Yields after every chunk so the caller can pass on what the
 * chunk produced, and gives the event loop a turn every few milliseconds of work. Throws
 * XmlSyntaxError at the first error and when the document ends early.
 */
export async function* parseXml(
	chunks: AsyncIterable<Buffer>,
	handler: XmlHandler
): AsyncGenerator<void> {
	const parser = new SaxesParser({ position: true });
	let failure: XmlSyntaxError | null = null;
	parser.on('error', (err) => (failure ??= new XmlSyntaxError(err.message, parser.line)));
	parser.on('opentag', (tag) => {
		handler.open(localName(tag.name), (tag as SaxesTagPlain).attributes);
	});
	parser.on('closetag', (tag) => handler.close(localName(tag.name)));
	parser.on('text', (text) => handler.text(text));
	parser.on('cdata', (text) => handler.text(text));
	const decoder = new StringDecoder('utf8');
	let sliceStart = performance.now();
	for await (const chunk of chunks) {
		parser.write(decoder.write(chunk));
		if (failure) throw failure;
		yield;
		if (performance.now() - sliceStart > SLICE_MS) {
			await setImmediate();
			sliceStart = performance.now();
		}
	}
	parser.write(decoder.end());
	parser.close();
	if (failure) throw failure;
}

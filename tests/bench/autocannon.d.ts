// autocannon 8 ships no types and @types/autocannon is not installed: the little the load
// bench uses, typed here.
declare module 'autocannon' {
	namespace autocannon {
		interface Request {
			method?: string;
			path?: string;
			body?: string;
			headers?: Record<string, string>;
		}
		interface Options {
			url: string;
			connections?: number;
			duration?: number;
			timeout?: number;
			requests?: Request[];
		}
		interface Result {
			errors: number;
			timeouts: number;
			non2xx: number;
		}
		interface Instance extends PromiseLike<Result> {
			on(
				event: 'response',
				listener: (client: unknown, statusCode: number, bytes: number, ms: number) => void
			): void;
		}
	}
	function autocannon(options: autocannon.Options): autocannon.Instance;
	export default autocannon;
}

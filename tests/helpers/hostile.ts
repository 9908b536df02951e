/** Values an attacker types into text fields; each test sends them all. */

/** Marks what the hostile tests store on purpose, so that they can remove it again. */
export const MARK = 'HOSTILE-TEST';

/** Quotes, comment openers, a statement break, LIKE wildcards and a backslash. */
export const SQL_META = `x' OR '1'='1' -- ; "; DROP TABLE users; /* % _ \\ \` ) UNION SELECT password_hash FROM users #`;

/** Script and markup that must come back as text wherever it is shown. */
export const SCRIPT = `<script>alert("fractile")</script><img src=x onerror="alert(1)">`;

/** 100 kB strings: one plain, one of metacharacters. */
export function hostileValues(): Record<string, string> {
	return {
		sql: SQL_META,
		script: SCRIPT,
		long: 'A'.repeat(100_000),
		longSql: SQL_META.repeat(Math.ceil(100_000 / SQL_META.length)),
		nul: 'a\u0000b',
		unicode: '\u202e\ud83d\ude00 ﷽ \uFEFF'
	};
}

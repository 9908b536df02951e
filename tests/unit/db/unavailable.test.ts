import { SqlError, type SqlError as SqlErrorType } from 'mariadb';
import { ConnectionRefusedError, DatabaseError, UniqueConstraintError } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from '$lib/server/db/unavailable';

/**
 * A connector error as mariadb 3.0 makes them: (message, sql, fatal, info, sqlState, errno) in
 * lib/misc/errors.js; its type declaration leaves out `sql`, hence the cast.
 */
const RuntimeSqlError = SqlError as unknown as new (...args: unknown[]) => SqlErrorType;
const connectorError = (errno: number, fatal: boolean) =>
	new RuntimeSqlError('test', null, fatal, null, 'HY000', errno);

/** A Node system error, as a refused TCP connection raises it (node:net). */
const refused = (port: number) =>
	Object.assign(new Error(`connect ECONNREFUSED 127.0.0.1:${port}`), { code: 'ECONNREFUSED' });

describe('telling a database that is down from other failures', () => {
	it('is down: a refused pool connection, a socket closed under a query, a server shutting down', () => {
		expect(isDatabaseUnavailable(new ConnectionRefusedError(refused(3306)))).toBe(true);
		// mariadb driver errno 45009: ER_SOCKET_UNEXPECTED_CLOSE (connector's own code table).
		const closed = connectorError(45009, true);
		expect(closed.code).toBe('ER_SOCKET_UNEXPECTED_CLOSE');
		expect(isDatabaseUnavailable(closed)).toBe(true);
		expect(isDatabaseUnavailable(new DatabaseError(closed as never))).toBe(true);
		// MariaDB errno 1053: ER_SERVER_SHUTDOWN ("Server shutdown in progress").
		expect(isDatabaseUnavailable(new DatabaseError(connectorError(1053, false) as never))).toBe(
			true
		);
	});

	it('is not down: a query the database refused, or another service refusing a connection', () => {
		// MariaDB errno 1062: ER_DUP_ENTRY, a unique index said no.
		const duplicate = connectorError(1062, false);
		expect(isDatabaseUnavailable(new DatabaseError(duplicate as never))).toBe(false);
		expect(isDatabaseUnavailable(new UniqueConstraintError({}))).toBe(false);
		// Object storage or mail on its own port: the same code, not the database.
		expect(isDatabaseUnavailable(refused(4570))).toBe(false);
		expect(isDatabaseUnavailable(new Error('upload failed', { cause: refused(4570) }))).toBe(false);
		expect(isDatabaseUnavailable(new Error('plain'))).toBe(false);
	});
});

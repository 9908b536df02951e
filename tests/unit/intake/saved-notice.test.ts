import { describe, expect, it } from 'vitest';
import { savedNoticeFor, withSavedNotice } from '../../../src/lib/intake/savedNotice';

describe('the notice after an edit page saves', () => {
	it('adds the saved parameter to a path with or without a query', () => {
		expect(withSavedNotice('/members/7/entry', 'member')).toBe('/members/7/entry?saved=member');
		expect(withSavedNotice('/surveys/3?tab=holes', 'hole')).toBe('/surveys/3?tab=holes&saved=hole');
	});

	it('shows only its own words: unknown or inherited keys give no notice', () => {
		expect(savedNoticeFor('member')).toBe("The member's specified values were saved.");
		expect(savedNoticeFor(null)).toBeNull();
		expect(savedNoticeFor('<script>alert(1)</script>')).toBeNull();
		expect(savedNoticeFor('toString')).toBeNull();
	});
});

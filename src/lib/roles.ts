/** The five roles as people read them; the server's enum is in db/migrations/001-accounts. */
export const ROLE_OPTIONS = [
	{ value: 'admin', label: 'Admin — everything, people and roles included' },
	{ value: 'engineer', label: 'Engineer — assessments and approval' },
	{ value: 'surveyor', label: 'Surveyor — surveys and readings' },
	{ value: 'owner', label: 'Owner — approved results of shared assets' },
	{ value: 'researcher', label: 'Researcher — anonymised data' }
] as const;

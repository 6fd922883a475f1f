/** The invented demo scenario's people. Demo passwords only: the seed refuses to run in production. */
export const DEMO_FIRM = {
	name: 'Tallowmere Electric Co.',
	licenceNumber: 'EC-40917',
	phone: '555-0142',
	address: '18 Kettleby Row, Quillmere',
};
export const DEMO_JURISDICTION = {
	name: 'Quillmere County Building Division',
	codeEdition: '2023',
	address: '2 Civic Loop, Quillmere',
	fees: { baseCents: 7_500, perCircuitCents: 1_200, perPanelCents: 3_500, serviceChangeCents: 12_500 },
	permitNumberPattern: 'QC-E{YYYY}-{SEQ:4}',
};

export const DEMO_ACCOUNTS = {
	owner: {
		email: 'marisol@tallowmere-electric.example',
		name: 'Marisol Quenby',
		password: 'demo-owner-2026',
		role: 'contractor (firm owner)',
	},
	electrician: {
		email: 'teodor@tallowmere-electric.example',
		name: 'Teodor Vask',
		password: 'demo-electrician-2026',
		role: 'contractor (electrician)',
	},
	inspector: {
		email: 'ines.halloway@quillmere-county.example',
		name: 'Ines Halloway',
		password: 'demo-inspector-2026',
		role: 'inspector',
	},
	homeowner: {
		email: 'odalys.penhallow@mail.example',
		name: 'Odalys Penhallow',
		password: 'demo-homeowner-2026',
		role: 'homeowner',
	},
	homeowner2: {
		email: 'rufus.calderwood@mail.example',
		name: 'Rufus Calderwood',
		password: 'demo-homeowner2-2026',
		role: 'homeowner',
	},
	homeowner3: {
		email: 'idris.farrowdale@mail.example',
		name: 'Idris Farrowdale',
		password: 'demo-homeowner3-2026',
		role: 'homeowner',
	},
	admin: {
		email: 'wren.ashdown@ampledger.example',
		name: 'Wren Ashdown',
		password: 'demo-admin-2026',
		role: 'administrator',
	},
} as const;

export const DEMO_PROPERTIES = {
	penhallow: '417 Fenwick Reach Road, Quillmere',
	calderwood: '9 Orrin Lane, Quillmere',
	/** The third homeowner's new house, where a permit has been carried to its final inspection. */
	brindle: '6 Brindle Copse Way, Quillmere',
};

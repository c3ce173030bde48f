/**
 * Capture metadata for people: the importers keep each source field under a key of their own
 * ('comtrade.time_code', 'wav.ICMT', 'line 3'); the printed report names them in words and cuts long values.
 */

const NAMES: Record<string, string> = {
	'comtrade.time_code': 'Time code (offset of the recorder clock from UTC)',
	'comtrade.local_code': 'Local time offset from UTC',
	'comtrade.tmq_code': 'Time quality of the recorder clock',
	'comtrade.leapsec': 'Leap second',
	'comtrade.hdr': 'Header file text',
	'comtrade.inf': 'Information file text',
	'wav.INAM': 'Title',
	'wav.ICMT': 'Comment',
	'wav.ICRD': 'Recorded on',
	'wav.ISFT': 'Software',
	'wav.IART': 'Made by',
	'first time stamp': 'First time stamp',
};

/** A metadata key in words: "Circuit of Ua" for comtrade.ccbm.Ua, "Title" for wav.INAM; else the key with separators as spaces. */
export function metadataLabel(key: string): string {
	if (NAMES[key]) return NAMES[key];
	const ccbm = /^comtrade\.ccbm\.(.+)$/.exec(key);
	if (ccbm) return `Circuit of ${ccbm[1]}`;
	const text = key
		.replace(/^(comtrade|wav|csv)\./, '')
		.replace(/[._]+/g, ' ')
		.trim();
	return text.charAt(0).toUpperCase() + text.slice(1);
}

/** A value cut to `max` characters with an ellipsis. */
export function metadataValue(value: string, max = 160): string {
	const v = value.replace(/\s+/g, ' ').trim();
	return v.length > max ? `${v.slice(0, max - 1)}…` : v;
}

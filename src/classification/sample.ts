/**
 * The bundled classification bridge and county jobs by its codes (invented; the codes FH-01 … belong to no real
 * classification). Written by sample-data/generate-supply-use.ts; do not edit by hand.
 */
export const BRIDGE_SAMPLE_FILE_NAME = 'fernhollow-bridge.csv';
export const EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME = 'fernhollow-employment-by-code.csv';
export const BRIDGE_SAMPLE_CSV = "code,sector,share\nFH-01,Farming,\nFH-02,Forestry and logging,\nFH-03,Mining and quarrying,\nFH-04,Utilities,\nFH-05,Construction,\nFH-06,Food processing,\nFH-07,Wood and paper products,\nFH-08,Metal and machinery,\nFH-09,Wholesale and retail trade,\nFH-10,Transport and warehousing,\nFH-11,Information and finance,\nFH-12,Real estate,0.4\nFH-12,Professional services,0.6\nFH-13,Health and social care,\nFH-14,Accommodation and food service,\nFH-90,Public administration and education,\nFH-91,Public administration and education,\n";
export const EMPLOYMENT_BY_CODE_SAMPLE_CSV = "code,regional\nFH-01,3742\nFH-02,1015\nFH-03,457\nFH-04,383\nFH-05,3796\nFH-06,2189\nFH-07,1204\nFH-08,1427\nFH-09,7528\nFH-10,1976\nFH-11,1454\nFH-12,3500\nFH-13,5001\nFH-14,4352\nFH-90,4100\nFH-91,2557\n";

/**
 * The bundled example study: the invented Fernhollow County's new food plant in two phases — building it (one-time)
 * and operating it (annual, 20 years). The same text as sample-data/fernhollow-food-plant.csv (a test compares them),
 * so the app can offer the README's walkthrough without reading a file. Invented numbers, not data.
 */
export const SAMPLE_SHOCK_FILE_NAME = 'fernhollow-food-plant.csv';
export const SAMPLE_SHOCK_CSV = "sector,amount,kind,local_share,phase,timing,year,years,note\nConstruction,12000,final-demand,0.8,Building the plant,once,2026,,Invented example: building the plant (thousand dollars); 80 % built by county firms\nFood processing,300,jobs,1,Operating the plant,annual,2027,20,Invented example: the plant runs with 300 jobs a year for 20 years\n";

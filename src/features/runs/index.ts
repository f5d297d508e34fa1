/** What the runs feature offers other screens (composed in src/app/routes). */
export {};

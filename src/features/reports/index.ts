/** What the reports feature offers other screens (composed in src/app/routes). */
export {};

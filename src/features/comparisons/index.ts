/** What the comparisons feature offers other screens (composed in src/app/routes). */
export {};

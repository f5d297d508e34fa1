/** What the finder feature offers other screens (composed in src/app/routes). */
export {};

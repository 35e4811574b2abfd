// Replaced by the database chooser in the foundation work; engine tests need nothing here.
export default async function setup(): Promise<void> {}

/** The box around rendered Markdown; its children are styled by `.armilla-md` in src/styles/global.css. */
export const MD_BOX = 'flex flex-col gap-2 leading-relaxed';

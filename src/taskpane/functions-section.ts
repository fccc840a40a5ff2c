import { $, listItem, messageOf } from './dom';
import { listedFunctions } from './function-list';

/* The list of worksheet functions, read from the functions.json served with the pane. */

/** Lists the REMAP functions with their descriptions. */
export async function showFunctions(): Promise<void> {
  const list = $('function-list');
  try {
    const response = await fetch('functions.json', { cache: 'no-cache' });
    if (!response.ok) throw new Error(`HTTP ${response.status}`);
    const functions = listedFunctions(await response.json());
    list.replaceChildren(
      ...functions.map((f) => {
        const item = document.createElement('li');
        const code = document.createElement('code');
        code.textContent = `REMAP.${f.name}`;
        item.append(code);
        if (f.description) item.append(` \u2014 ${f.description}`);
        return item;
      }),
    );
  } catch (e) {
    list.replaceChildren(listItem(`Could not read the function list (${messageOf(e)}).`, 'muted'));
  }
}

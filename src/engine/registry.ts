/* Lists every method the product offers; importing this module registers them,
 * in the order menus show them. To add a method: write its folder, export a
 * MethodSpec, and add it here (DEVELOPERS.md, "Adding a method"). */
import { entropicMethod } from './entropic/method';
import { gradientNetMethod } from './gradient-net/method';
import { linearMethod } from './linear/method';
import { registerMethod } from './methods';
import { pairsMethod } from './pairs/method';
import { ordinalMethod } from './quantile/ordinal-method';
import { quantileMethod } from './quantile/quantile-method';
import { stepMethod } from './quantile/step-method';

for (const spec of [quantileMethod, stepMethod, ordinalMethod, linearMethod, pairsMethod, entropicMethod, gradientNetMethod]) registerMethod(spec);

import { resourceMissing } from './api-error.js';
import { route } from './api-route.js';
import { readExpand } from './expand.js';
import { renderCharge } from './stripe-objects.js';

export const chargeRoutes = [
  route({
    method: 'GET',
    path: /^\/v1\/charges\/([^/]+)$/,
    parse: (p) => readExpand(p, 'charge'),
    run(fake, expand, { ids }) {
      const charge = fake.state.charges.get(ids[0]!);
      if (!charge) throw resourceMissing('charge', ids[0]!, 'charge');
      return renderCharge(fake.state, charge, expand);
    },
  }),
];

/** Ports of the app and the local services, one set for running Rootbank and one for its tests. */
export interface Ports {
  app: number;
  smtp: number;
  inboxHttp: number;
  forecast: number;
  push: number;
}

export const RUN_PORTS: Ports = {
  app: Number(process.env.PORT ?? 3000),
  smtp: 2525,
  inboxHttp: 2580,
  forecast: 2590,
  push: 2595,
};

export const TEST_PORTS: Ports = { app: 3100, smtp: 2625, inboxHttp: 2680, forecast: 2690, push: 2695 };

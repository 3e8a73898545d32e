/** The one header better-auth reads a client's address from; only the gate writes it. */
export const clientAddressHeader = 'x-cyclemoot-client-address';

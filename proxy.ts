import { withAuth } from "next-auth/middleware";

// The proxy only redirects signed-out visitors to the sign-in page. Every page, action
// and handler checks the user, role and organisation again through lib/auth/guard.ts.
export default withAuth({ pages: { signIn: "/login" } });

export const config = {
  matcher: ["/", "/projects/:path*", "/admin/:path*", "/sheets/:path*", "/review/:path*", "/account/:path*", "/api-docs/:path*", "/my-sheets/:path*", "/ampacity-tables/:path*"],
};

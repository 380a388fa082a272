import MuiLink, { type LinkProps as MuiLinkProps } from '@mui/material/Link';
import { Link, type LinkProps } from 'react-router-dom';

type RouterLinkProps = Omit<MuiLinkProps, 'href'> & { to: LinkProps['to'] };

/** An MUI-styled link that navigates inside the app without a page load. */
export function RouterLink(props: RouterLinkProps) {
  return <MuiLink component={Link} {...props} />;
}

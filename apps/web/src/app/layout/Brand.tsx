import { Link } from 'react-router-dom';
import { paths } from '../../lib/paths';
import { BrandLockup } from './BrandLockup';

export function Brand() {
  return (
    <Link to={paths.dashboard()} style={{ textDecoration: 'none' }} aria-label="Hitchbook home">
      <BrandLockup />
    </Link>
  );
}

import AssignmentTurnedInOutlined from '@mui/icons-material/AssignmentTurnedInOutlined';
import BusinessOutlined from '@mui/icons-material/BusinessOutlined';
import DescriptionOutlined from '@mui/icons-material/DescriptionOutlined';
import FactoryOutlined from '@mui/icons-material/FactoryOutlined';
import HistoryOutlined from '@mui/icons-material/HistoryOutlined';
import HomeOutlined from '@mui/icons-material/HomeOutlined';
import LayersOutlined from '@mui/icons-material/LayersOutlined';
import OutboxOutlined from '@mui/icons-material/OutboxOutlined';
import PeopleOutlined from '@mui/icons-material/PeopleOutlined';
import PrecisionManufacturingOutlined from '@mui/icons-material/PrecisionManufacturingOutlined';
import QueueOutlined from '@mui/icons-material/QueueOutlined';
import RequestQuoteOutlined from '@mui/icons-material/RequestQuoteOutlined';
import RuleOutlined from '@mui/icons-material/RuleOutlined';
import ScienceOutlined from '@mui/icons-material/ScienceOutlined';
import type { SvgIconComponent } from '@mui/icons-material';
import type { NavSection } from '@quietglass/shared';

export const HOME_ICON: SvgIconComponent = HomeOutlined;

export const SECTION_ICONS: Readonly<Record<NavSection['key'], SvgIconComponent>> = {
  designs: LayersOutlined,
  materials: ScienceOutlined,
  customers: BusinessOutlined,
  masks: RuleOutlined,
  queue: QueueOutlined,
  recipes: AssignmentTurnedInOutlined,
  runs: PrecisionManufacturingOutlined,
  chambers: FactoryOutlined,
  reports: DescriptionOutlined,
  quotes: RequestQuoteOutlined,
  outbox: OutboxOutlined,
  audit: HistoryOutlined,
  users: PeopleOutlined,
};

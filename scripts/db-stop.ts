import { stopProjectDatabase } from './lib/mariadb';

console.log(stopProjectDatabase() ? 'Stopped the project database.' : 'The project database is not running.');

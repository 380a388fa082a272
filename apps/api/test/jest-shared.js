// Jest settings shared by the API's unit and end-to-end suites.
const path = require('node:path');

module.exports = {
  testEnvironment: 'node',
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { tsconfig: path.join(__dirname, '..', 'tsconfig.spec.json') }],
    '^.+\\.m?js$': [
      'babel-jest',
      {
        babelrc: false,
        configFile: false,
        plugins: [
          require.resolve('@babel/plugin-transform-modules-commonjs'),
          require.resolve('@babel/plugin-transform-dynamic-import'),
          require.resolve('./babel-import-meta.js'),
        ],
      },
    ],
  },
  transformIgnorePatterns: ['/node_modules/(?!(@nestjs|quickhull3d)/)'],
};
